import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button, Form, SubmitButton, TextField } from '@/components/forms';
import { isApiError, useAlarmAckMutation } from '@/components/queries';
import { colors, space, type } from '@/components/theme';

import { ackNoteProblem, ACK_NOTE_MAX } from './alarmText';

interface AlarmAckFormProps {
  shopId: string;
  alarmId: string;
  /** Called after the acknowledgement is stored, or when the person cancels. */
  onDone: () => void;
}

/** Acknowledging an alarm: a short note of what was done, checked here and by the server. */
export function AlarmAckForm({ shopId, alarmId, onDone }: AlarmAckFormProps) {
  const [note, setNote] = useState('');
  const [tried, setTried] = useState(false);
  const ack = useAlarmAckMutation(shopId);
  const problem = ackNoteProblem(note);
  const serverProblem = isApiError(ack.error)
    ? (ack.error.details.find((d) => d.path === 'note')?.message ?? ack.error.message)
    : ack.error?.message;

  const submit = () => {
    setTried(true);
    if (problem || ack.isPending) return;
    ack.mutate({ alarmId, note: note.trim() }, { onSuccess: onDone });
  };

  return (
    <Form onSubmit={submit} style={styles.form}>
      <TextField
        label="What did you do?"
        placeholder="Wiped and covered the saw top"
        value={note}
        onChangeText={setNote}
        maxLength={ACK_NOTE_MAX + 20}
        autoFocus
        onSubmitEditing={submit}
        error={tried && problem ? problem : undefined}
        testID="alarm-ack-note"
      />
      {serverProblem ? (
        <Text style={[type.small, styles.error]} role="alert" testID="alarm-ack-error">
          {serverProblem}
        </Text>
      ) : null}
      <View style={styles.buttons}>
        <SubmitButton
          label="Acknowledge"
          sendingLabel="Saving…"
          sending={ack.isPending}
          onPress={submit}
          testID="alarm-ack-save"
        />
        <Button label="Cancel" variant="quiet" onPress={onDone} testID="alarm-ack-cancel" />
      </View>
    </Form>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.sm, paddingTop: space.xs, width: '100%', maxWidth: 560 },
  buttons: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  error: { color: colors.wet },
});
