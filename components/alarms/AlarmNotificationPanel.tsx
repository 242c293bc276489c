import { useState } from 'react';
import { StyleSheet, Switch, Text, View } from 'react-native';

import { colors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { Panel } from '@/components/ui';

import {
  notificationsOptedIn,
  notificationSupport,
  setNotificationsOptIn,
  type NotificationSupport,
} from './alarmNotifications';

const LABEL = 'Notify me in this browser when an alarm opens';
// react-native-web paints an "on" thumb its own teal unless told; native ignores the prop.
const WEB_SWITCH_COLORS: Record<string, string> = { activeThumbColor: colors.card };

function statusOf(support: NotificationSupport, on: boolean): string {
  if (support === 'unavailable') {
    return 'Unavailable: this browser cannot show notifications. Alarm e-mails still reach you.';
  }
  if (support === 'denied') {
    return 'Blocked: this browser refuses Drybench’s notifications. Allow them in the site settings, then turn this on.';
  }
  return on
    ? 'On in this browser: each new alarm shows a notification; a tap on it opens the alarm.'
    : 'Off in this browser. Turning it on asks the browser for permission.';
}

/**
 * The Profile switch for browser notifications of new alarms. A device setting, kept in this
 * browser; permission is requested from the tap itself (browsers ignore or penalise a request
 * that no gesture started), never when the page loads.
 */
export function AlarmNotificationPanel() {
  const [support, setSupport] = useState<NotificationSupport>(notificationSupport);
  const [on, setOn] = useState(() => notificationsOptedIn() && support === 'granted');
  const [asking, setAsking] = useState(false);

  const change = (wanted: boolean) => {
    setAsking(true);
    void setNotificationsOptIn(wanted).then((nowOn) => {
      setOn(nowOn);
      setSupport(notificationSupport());
      setAsking(false);
    });
  };

  return (
    <Panel title="Browser notifications" hint="A setting of this device, not of your account.">
      <View style={styles.switchRow}>
        <Text style={[type.body, styles.switchLabel]} nativeID="profile-notify-label">
          {LABEL}
        </Text>
        <Switch
          value={on}
          onValueChange={change}
          disabled={support === 'unavailable' || asking}
          accessibilityLabel={LABEL}
          aria-labelledby="profile-notify-label"
          trackColor={{ false: colors.border, true: colors.dry }}
          thumbColor={colors.card}
          {...WEB_SWITCH_COLORS}
          style={styles.switch}
          testID="profile-notify"
        />
      </View>
      <Text style={type.small} role="status" testID="profile-notify-status">
        {statusOf(support, on)}
      </Text>
    </Panel>
  );
}

const styles = StyleSheet.create({
  switchRow: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  switchLabel: { flex: 1, minWidth: 0 },
  // react-native-web sizes the switch from its height: a full 44 px target (TAP_TARGET_PX).
  switch: { height: TAP_TARGET_PX },
});
