import { useState } from 'react';
import { Platform, StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { colors, fonts, radius, space, type } from '@/components/theme';
import { Panel } from '@/components/ui';

interface TokenRevealProps {
  sensorName: string;
  token: string;
  onDone: () => void;
}

/** The origin the sensor should post to: this page's own, as seen by the browser. */
function apiOrigin(): string {
  return Platform.OS === 'web' && typeof window !== 'undefined'
    ? window.location.origin
    : 'https://drybench.example';
}

/** A ready command for the sensor's first reading, as in the HTTP contract (API.md). */
export function curlExample(origin: string, token: string): string {
  return [
    `curl -X POST ${origin}/api/v1/ingest \\`,
    `  -H 'Authorization: Bearer ${token}' \\`,
    `  -H 'Content-Type: application/json' \\`,
    `  -d '{"air": 14.2, "rh": 71, "surface": 11.9}'`,
  ].join('\n');
}

async function copy(text: string): Promise<boolean> {
  try {
    await navigator.clipboard.writeText(text);
    return true;
  } catch {
    return false;
  }
}

/**
 * The one time a sensor's token is shown (it is stored only as a hash): the token with a copy
 * button, and a curl command that posts a first reading with it.
 */
export function TokenReveal({ sensorName, token, onDone }: TokenRevealProps) {
  const [copied, setCopied] = useState<'token' | 'curl' | 'failed' | null>(null);
  const command = curlExample(apiOrigin(), token);
  const copyThis = async (what: 'token' | 'curl') =>
    setCopied((await copy(what === 'token' ? token : command)) ? what : 'failed');

  return (
    <Panel
      title={`Token for ${sensorName}`}
      hint="Shown this once: Drybench keeps only a fingerprint of it. Put it in the sensor now."
      testID="token-reveal"
    >
      <Text selectable style={styles.code} testID="sensor-token" accessibilityLabel="Sensor token">
        {token}
      </Text>
      <View style={styles.row}>
        <Button label="Copy token" onPress={() => void copyThis('token')} testID="copy-token" />
        <Button
          label="Copy curl command"
          variant="quiet"
          onPress={() => void copyThis('curl')}
          testID="copy-curl"
        />
      </View>
      <Text style={type.small} role="status" aria-live="polite" testID="copy-status">
        {copied === 'token'
          ? 'Token copied.'
          : copied === 'curl'
            ? 'Command copied.'
            : copied === 'failed'
              ? 'This browser refused to copy; select the text and copy it by hand.'
              : ' '}
      </Text>
      <Text style={type.label}>Try it: post a first reading</Text>
      <Text selectable style={styles.code} testID="sensor-curl">
        {command}
      </Text>
      <Button
        label="Done, the sensor has it"
        variant="quiet"
        onPress={onDone}
        testID="token-done"
      />
    </Panel>
  );
}

const styles = StyleSheet.create({
  code: {
    fontFamily: fonts.regular,
    fontSize: 13,
    lineHeight: 19,
    color: colors.ink,
    backgroundColor: colors.paper,
    borderColor: colors.border,
    borderWidth: 1,
    borderRadius: radius.control,
    padding: space.md,
  },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
