import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';

import {
  ackNoteProblem,
  acknowledgementLine,
  alarmHeadline,
  bannerAlarms,
} from '@/components/alarms/alarmText';
import { applyLiveMessage, parseLiveMessage } from '@/components/live';
import { alarmKeys, withAlarm, type Alarm, type AlarmsResponse } from '@/components/queries';

const TZ = 'America/Chicago';
const NOW_MS = Date.parse('2026-01-14T14:00:00Z'); // 08:00 in Chicago (UTC−6 in January)

const alarm = (extra: Partial<Alarm> = {}): Alarm => ({
  id: 'a1',
  kind: 'dew_risk',
  state: 'open',
  zone: { id: 'z1', name: 'Machine room' },
  sensor: null,
  sinceAt: '2026-01-14T12:40:00Z',
  openedAt: '2026-01-14T12:40:00Z',
  updatedAt: '2026-01-14T12:40:00Z',
  clearedAt: null,
  worstMarginK: 2.4,
  latestMarginK: 2.6,
  minutesToWet: 41.3,
  peakRhPct: null,
  latestRhPct: null,
  lowestBatteryV: null,
  latestBatteryV: null,
  acknowledgement: null,
  ...extra,
});

describe('alarm words', () => {
  it.each([
    [alarm(), 'Machine room: wet in about 40 min'],
    [alarm({ minutesToWet: null }), 'Machine room: dew risk, margin +2.6 °C'],
    [alarm({ kind: 'wet_surface', latestMarginK: -0.42 }), 'Machine room: wet, margin -0.4 °C'],
    // The same words as the humid-air e-mail's subject (ingest/words/alarms.ts).
    [
      alarm({ kind: 'humid_air', latestRhPct: 72.4 }),
      'Machine room: humid air since 06:40, 72 % RH',
    ],
    [
      alarm({
        kind: 'sensor_silent',
        sensor: { id: 's1', name: 'Rack hygrometer' },
        sinceAt: '2026-01-14T12:12:00Z',
      }),
      'Rack hygrometer silent since 06:12',
    ],
    [
      alarm({ kind: 'battery_low', sensor: { id: 's1', name: 'Saw probe' }, latestBatteryV: 2.64 }),
      'Saw probe: battery low, 2.64 V',
    ],
  ])('%#: %s', (a, words) => {
    expect(alarmHeadline(a, NOW_MS, TZ)).toBe(words);
  });

  it('orders the banner: unanswered first, worst first, without a wet zone’s dew risk', () => {
    const wet = alarm({ id: 'w', kind: 'wet_surface' });
    const humid = alarm({ id: 'h', kind: 'humid_air', zone: { id: 'z2', name: 'Lumber rack' } });
    const otherRisk = alarm({ id: 'd2', zone: { id: 'z2', name: 'Lumber rack' } });
    expect(bannerAlarms([humid, alarm(), otherRisk, wet]).map((a) => a.id)).toEqual([
      'w',
      'd2',
      'h',
    ]);
    // An answered alarm moves below the ones nobody has answered yet.
    const ack = { by: { id: 'u1', name: 'Ana' }, at: '2026-01-14T13:00:00Z', note: 'Covered' };
    const answered = { ...wet, acknowledgement: ack };
    expect(bannerAlarms([answered, humid]).map((a) => a.id)).toEqual(['h', 'w']);
  });

  it('names only what a cleared alarm was', () => {
    const cleared = { state: 'cleared' as const, clearedAt: '2026-01-14T13:30:00Z' };
    expect(alarmHeadline(alarm({ kind: 'wet_surface', ...cleared }), NOW_MS, TZ)).toBe(
      'Machine room: wet surface',
    );
    const silent = alarm({ kind: 'sensor_silent', sensor: { id: 's1', name: 'Rack hygrometer' } });
    expect(alarmHeadline({ ...silent, ...cleared }, NOW_MS, TZ)).toBe('Rack hygrometer was silent');
  });

  it('says who acknowledged and what they did', () => {
    const ack = {
      by: { id: 'u1', name: 'Ana' },
      at: '2026-01-14T13:00:00Z',
      note: 'Wiped and covered',
    };
    expect(acknowledgementLine(alarm({ acknowledgement: ack }))).toBe(
      'Wiped and covered — acknowledged by Ana',
    );
    expect(acknowledgementLine(alarm())).toBeNull();
  });

  it('checks a note as the server does: 1–500 characters after trimming', () => {
    expect(ackNoteProblem('   ')).toMatch(/few words/);
    expect(ackNoteProblem(' Covered ')).toBeNull();
    expect(ackNoteProblem('x'.repeat(500))).toBeNull();
    expect(ackNoteProblem('x'.repeat(501))).toMatch(/500/);
  });
});

describe('alarm lists in the cache', () => {
  const list = (...alarms: Alarm[]): AlarmsResponse => ({ alarms });

  it('adds, replaces and drops cleared alarms from the open list, never going back in time', () => {
    const opened = alarm();
    const acked = alarm({
      acknowledgement: {
        by: { id: 'u1', name: 'Ana' },
        at: '2026-01-14T13:00:00Z',
        note: 'Heater on',
      },
    });
    const cleared = alarm({
      ...acked,
      state: 'cleared',
      updatedAt: '2026-01-14T15:00:00Z',
      clearedAt: '2026-01-14T15:00:00Z',
    });
    expect(withAlarm(list(), opened, 'open').alarms).toEqual([opened]);
    expect(withAlarm(list(opened), acked, 'open').alarms).toEqual([acked]);
    // The un-acknowledged version arriving late changes nothing.
    expect(withAlarm(list(acked), opened, 'open').alarms).toEqual([acked]);
    expect(withAlarm(list(acked), cleared, 'open').alarms).toEqual([]);
    expect(withAlarm(list(acked), cleared, 'all').alarms).toEqual([cleared]);
  });

  it('patches both lists from a live alarm message, and refetches a cut one', () => {
    const client = new QueryClient();
    client.setQueryData(alarmKeys.list('s1', 'open'), list());
    client.setQueryData(alarmKeys.list('s1', 'all'), list());
    const frame = (extra: Record<string, unknown>) =>
      JSON.stringify({ type: 'alarm', shopId: 's1', alarm: alarm(), ...extra });
    applyLiveMessage(client, parseLiveMessage(frame({}))!);
    for (const state of ['open', 'all'] as const) {
      expect(client.getQueryData<AlarmsResponse>(alarmKeys.list('s1', state))?.alarms).toHaveLength(
        1,
      );
    }

    applyLiveMessage(client, parseLiveMessage(frame({ partial: true }))!);
    expect(client.getQueryState(alarmKeys.list('s1', 'open'))?.isInvalidated).toBe(true);
    expect(parseLiveMessage(frame({ alarm: { ...alarm(), kind: 'fire' } }))).toBeNull();
  });
});
