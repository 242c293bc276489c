import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';

import { applyLiveMessage, parseLiveMessage } from '@/components/live';
import { meKeys, type Me } from '@/components/queries';

describe('an access message from the live hub', () => {
  it('is parsed, and makes /me stale so a removed shop disappears', () => {
    const message = parseLiveMessage(JSON.stringify({ type: 'access', shopIds: ['a'] }));
    expect(message).toEqual({ type: 'access', shopIds: ['a'] });
    expect(parseLiveMessage(JSON.stringify({ type: 'access', shopIds: [1] }))).toBeNull();

    const client = new QueryClient();
    const me: Me = {
      user: {
        id: 'u',
        email: 'u@test.example',
        name: 'U',
        unitPref: 'C',
        alarmMail: true,
        weekReportMail: true,
        emailVerified: true,
      },
      shops: [{ id: 'a', name: 'A', role: 'member', timeZone: 'UTC', paperSize: 'a4' }],
    };
    client.setQueryData(meKeys.all, me);
    expect(client.getQueryState(meKeys.all)?.isInvalidated).toBe(false);
    applyLiveMessage(client, message!);
    expect(client.getQueryState(meKeys.all)?.isInvalidated).toBe(true);
  });
});
