// The Profile switch for alarm notifications where the Notification API does not exist (this
// test runs in Node, which has none, as an old or locked-down browser would): it says so, stays
// off and cannot be switched on, and nothing throws. The granted path runs in Chromium
// (tests/e2e/alarmsUnits.test.ts).
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { AlarmNotificationPanel } from '@/components/alarms/AlarmNotificationPanel';
import {
  notificationsOptedIn,
  notificationSupport,
  setNotificationsOptIn,
} from '@/components/alarms/alarmNotifications';

describe('alarm notifications without the Notification API', () => {
  it('explains they are unavailable and offers a disabled switch', () => {
    expect('Notification' in globalThis).toBe(false);
    const html = renderToStaticMarkup(createElement(AlarmNotificationPanel));
    expect(html).toContain('Unavailable: this browser cannot show notifications.');
    expect(html).toMatch(
      /<input[^>]*disabled=""[^>]*type="checkbox"|<input[^>]*type="checkbox"[^>]*disabled=""/,
    );
  });

  it('stays off when asked to turn on', async () => {
    expect(notificationSupport()).toBe('unavailable');
    await expect(setNotificationsOptIn(true)).resolves.toBe(false);
    expect(notificationsOptedIn()).toBe(false);
  });
});
