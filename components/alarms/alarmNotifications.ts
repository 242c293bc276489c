/**
 * Browser notifications for new alarms: a device setting, so the opt-in lives in this browser's
 * localStorage rather than on the account (a phone may want them where a shared shop PC does
 * not). Permission is asked only from the tap that opts in, never on load. Web only: elsewhere
 * (and in a browser without the Notification API) they are unavailable and say so.
 */
import { Platform } from 'react-native';

const STORAGE_KEY = 'drybench.alarmNotifications';

export type NotificationSupport = 'unavailable' | 'default' | 'granted' | 'denied';

/** What this browser allows: unavailable without the API (or off the web). */
export function notificationSupport(): NotificationSupport {
  if (Platform.OS !== 'web' || typeof window === 'undefined' || !('Notification' in window)) {
    return 'unavailable';
  }
  return window.Notification.permission;
}

/** Whether the person opted in on this browser. */
export function notificationsOptedIn(): boolean {
  try {
    return Platform.OS === 'web' && window.localStorage.getItem(STORAGE_KEY) === 'on';
  } catch {
    // Storage can be blocked (private modes, policies): then nobody opted in here.
    return false;
  }
}

function storeOptIn(on: boolean) {
  try {
    if (on) window.localStorage.setItem(STORAGE_KEY, 'on');
    else window.localStorage.removeItem(STORAGE_KEY);
  } catch {
    // Not remembered; the switch shows what happened.
  }
}

/**
 * Turns notifications on (asking for permission, which must happen inside the tap's handler)
 * or off; resolves to whether they are on now.
 */
export async function setNotificationsOptIn(on: boolean): Promise<boolean> {
  if (!on || notificationSupport() === 'unavailable') {
    storeOptIn(false);
    return false;
  }
  const permission =
    window.Notification.permission === 'granted'
      ? 'granted'
      : await window.Notification.requestPermission();
  storeOptIn(permission === 'granted');
  return permission === 'granted';
}

/** Shows one notification, if opted in and allowed; a tap on it runs `onOpen`. */
export function showAlarmNotification(
  words: { title: string; body: string },
  tag: string,
  onOpen: () => void,
): boolean {
  if (!notificationsOptedIn() || notificationSupport() !== 'granted') return false;
  const notification = new window.Notification(words.title, { body: words.body, tag });
  notification.onclick = () => {
    window.focus();
    onOpen();
    notification.close();
  };
  return true;
}
