import { useRouter } from 'expo-router';
import { StyleSheet, Switch, Text, View } from 'react-native';
import * as z from 'zod/mini';

import { AlarmNotificationPanel } from '@/components/alarms/AlarmNotificationPanel';
import {
  Button,
  Choice,
  Form,
  FormError,
  FormField,
  FormStatus,
  useApiForm,
} from '@/components/forms';
import { nameSchema, passwordChangeSchema } from '@/components/forms/schemas';
import {
  useMeQuery,
  usePasswordChangeMutation,
  useProfileMutation,
  useSignOutMutation,
  useVerificationResendMutation,
  type UnitPref,
  type User,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { colors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { Panel, useDocumentTitle } from '@/components/ui';

const UNIT_OPTIONS: readonly { value: UnitPref; label: string }[] = [
  { value: 'C', label: '°C' },
  { value: 'F', label: '°F' },
];

/**
 * The signed-in person: name, whether the address is verified, temperature units, alarm
 * e-mails, the Monday week-report e-mail, password, signing out.
 */
export function ProfileScreen() {
  const shop = useFrameShop();
  const me = useMeQuery();
  useDocumentTitle('Profile', shop.name);
  return me.data ? <ProfileBody user={me.data.user} /> : null;
}

function ProfileBody({ user }: { user: User }) {
  const router = useRouter();
  const profile = useProfileMutation();
  const signOut = useSignOutMutation();
  return (
    <>
      <NameForm user={user} />
      <VerificationPanel user={user} />
      <Panel title="Units" hint="How temperatures, dew margins and limits are shown to you.">
        <Choice
          label="Temperatures in"
          options={UNIT_OPTIONS}
          value={user.unitPref}
          disabled={profile.isPending}
          onChange={(unitPref) => profile.mutate({ unitPref })}
          testID="profile-unit"
        />
        <FormError message={profile.error?.message} />
      </Panel>
      <AlarmMailPanel user={user} />
      <WeekReportMailPanel user={user} />
      <AlarmNotificationPanel />
      <PasswordForm />
      <Panel title="Sign out" hint="Ends your sessions on every device.">
        <Button
          label="Sign out everywhere"
          variant="quiet"
          disabled={signOut.isPending}
          onPress={() => signOut.mutate(undefined, { onSettled: () => router.replace('/sign-in') })}
          testID="profile-sign-out"
        />
      </Panel>
    </>
  );
}

const ALARM_MAIL_LABEL = 'E-mail me when an alarm opens';
// No-break spaces keep "2 h" and "30 minutes" on one line.
const ALARM_MAIL_HINT =
  'For shops where you are an owner or member: dew risk, wet surface, a silent sensor or a low battery as soon as it opens; humid air once it has lasted 2\u00a0h. At most one mail per zone and kind in 30\u00a0minutes.';
// react-native-web paints an "on" thumb its own teal unless told; native ignores the prop.
const WEB_SWITCH_COLORS: Record<string, string> = { activeThumbColor: colors.card };

/** The on/off for alarm e-mails; the server reads it when it sends each one. */
function AlarmMailPanel({ user }: { user: User }) {
  const profile = useProfileMutation();
  return (
    <Panel title="Alarm e-mails" hint={ALARM_MAIL_HINT}>
      <View style={styles.switchRow}>
        <Text style={[type.body, styles.switchLabel]} nativeID="profile-alarm-mail-label">
          {ALARM_MAIL_LABEL}
        </Text>
        <Switch
          value={user.alarmMail}
          onValueChange={(alarmMail) => profile.mutate({ alarmMail })}
          disabled={profile.isPending}
          accessibilityLabel={ALARM_MAIL_LABEL}
          aria-labelledby="profile-alarm-mail-label"
          trackColor={{ false: colors.border, true: colors.dry }}
          thumbColor={colors.card}
          {...WEB_SWITCH_COLORS}
          style={styles.switch}
          testID="profile-alarm-mail"
        />
      </View>
      <Text style={type.small} role="status">
        {!user.alarmMail
          ? 'Off: no alarm e-mails.'
          : user.emailVerified
            ? `On: alarm e-mails go to ${user.email}.`
            : `On: alarm e-mails go to ${user.email} once the address is verified.`}
      </Text>
      <FormError message={profile.error?.message} />
    </Panel>
  );
}

const WEEK_MAIL_LABEL = 'Week report e-mail on Mondays';
const WEEK_MAIL_HINT =
  'For shops where you are an owner or member: last week’s report, Monday to Monday in the shop’s time zone, at 07:00 shop time each Monday, with the PDF attached.';

/** The on/off for the Monday week report; the server reads it when each Monday's mail goes. */
function WeekReportMailPanel({ user }: { user: User }) {
  const profile = useProfileMutation();
  return (
    <Panel title="Week report e-mail" hint={WEEK_MAIL_HINT}>
      <View style={styles.switchRow}>
        <Text style={[type.body, styles.switchLabel]} nativeID="profile-week-mail-label">
          {WEEK_MAIL_LABEL}
        </Text>
        <Switch
          value={user.weekReportMail}
          onValueChange={(weekReportMail) => profile.mutate({ weekReportMail })}
          disabled={profile.isPending}
          accessibilityLabel={WEEK_MAIL_LABEL}
          aria-labelledby="profile-week-mail-label"
          trackColor={{ false: colors.border, true: colors.dry }}
          thumbColor={colors.card}
          {...WEB_SWITCH_COLORS}
          style={styles.switch}
          testID="profile-week-mail"
        />
      </View>
      <Text style={type.small} role="status" testID="profile-week-mail-status">
        {!user.weekReportMail
          ? 'Off: no week report e-mails.'
          : user.emailVerified
            ? `On: the week report goes to ${user.email} on Mondays.`
            : `On: the week report goes to ${user.email} once the address is verified.`}
      </Text>
      <FormError message={profile.error?.message} />
    </Panel>
  );
}

/**
 * Whether the address is proved. Mail that matters (alarms, reports) waits for it, so an
 * unverified person is told so and can ask for the link again.
 */
function VerificationPanel({ user }: { user: User }) {
  const resend = useVerificationResendMutation();
  return (
    <Panel title="E-mail address" hint={user.email}>
      {user.emailVerified ? (
        <Text style={type.body} testID="profile-email-verified">
          Address verified.
        </Text>
      ) : (
        <>
          <Text style={type.body} testID="profile-email-unverified">
            Not verified yet — alarm and report e{'\u2011'}mails wait for it. Open the link we sent
            you, or ask for a new one.
          </Text>
          <FormStatus
            message={
              resend.data
                ? `Sent to ${resend.data.email}. The link works once, for 24\u00a0hours.`
                : null
            }
          />
          <FormError message={resend.error?.message} />
          <Button
            label={resend.isPending ? 'Sending…' : 'Send the link again'}
            variant="quiet"
            disabled={resend.isPending}
            onPress={() => resend.mutate()}
            testID="profile-verification-resend"
          />
        </>
      )}
    </Panel>
  );
}

const nameFormSchema = z.object({ name: nameSchema });

function NameForm({ user }: { user: User }) {
  const profile = useProfileMutation();
  const { control, submit, sending, formError, done } = useApiForm<{ name: string }>({
    schema: nameFormSchema,
    defaultValues: { name: user.name },
    fields: ['name'],
    send: async ({ name }) => {
      await profile.mutateAsync({ name: name.trim() });
    },
  });
  return (
    <Panel title="You" hint={`Signed in as ${user.email}.`}>
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Your name"
          testID="profile-name"
          autoComplete="name"
          editable={!sending}
        />
        <FormError message={formError} />
        {done ? (
          <Text style={type.small} role="status">
            Saved.
          </Text>
        ) : null}
        <Button
          label={sending ? 'Saving…' : 'Save name'}
          onPress={submit}
          disabled={sending}
          testID="profile-name-submit"
        />
      </Form>
    </Panel>
  );
}

function PasswordForm() {
  const change = usePasswordChangeMutation();
  const { form, control, submit, sending, formError, done } = useApiForm<{
    currentPassword: string;
    newPassword: string;
  }>({
    schema: passwordChangeSchema,
    defaultValues: { currentPassword: '', newPassword: '' },
    fields: ['currentPassword', 'newPassword'],
    send: async (values) => {
      await change.mutateAsync(values);
      form.reset({ currentPassword: '', newPassword: '' });
    },
  });
  return (
    <Panel title="Password" hint="Changing it signs you out on your other devices.">
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="currentPassword"
          label="Current password"
          testID="profile-current-password"
          secureTextEntry
          autoComplete="current-password"
          editable={!sending}
        />
        <FormField
          control={control}
          name="newPassword"
          label="New password (at least 10 characters)"
          testID="profile-new-password"
          secureTextEntry
          autoComplete="new-password"
          editable={!sending}
        />
        <FormError message={formError} />
        {done ? (
          <Text style={type.small} role="status">
            Password changed; other sessions have ended.
          </Text>
        ) : null}
        <Button
          label={sending ? 'Changing…' : 'Change password'}
          onPress={submit}
          disabled={sending}
          variant="quiet"
          testID="profile-password-submit"
        />
      </Form>
    </Panel>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  switchRow: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: 40 },
  switchLabel: { flex: 1 },
  // react-native-web sizes the switch (and the checkbox a finger presses) from its height: 44 px
  // makes it a full target (TAP_TARGET_PX); its width follows at twice that.
  switch: { height: TAP_TARGET_PX },
});
