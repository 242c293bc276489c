// A live reading moves its sensor's "last seen" in the cached sensor list, which the token
// screen's "first reading received" waits on; an older reading (a backlog) never moves it back.
import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';

import { applyLiveMessage, parseLiveMessage } from '@/components/live';
import { sensorKeys, type Sensor, type SensorsResponse } from '@/components/queries';

const sensor = (id: string, lastSeenAt: string | null): Sensor => ({
  id,
  name: id,
  zoneId: 'z1',
  zoneName: 'Machine room',
  lastSeenAt,
  batteryV: null,
  revokedAt: null,
  createdAt: '2026-03-01T00:00:00.000Z',
  interval: {
    setS: null,
    learnedS: null,
    effectiveS: 300,
    source: 'default',
    silentAfterS: 900,
    silentFrom: null,
  },
});

const reading = (sensorId: string, at: string) =>
  parseLiveMessage(
    JSON.stringify({
      type: 'reading',
      shopId: 's1',
      zoneId: 'z1',
      sensorId,
      count: 1,
      reading: {
        at,
        air: 18,
        rh: 50,
        surface: 17,
        dewPoint: 7.4,
        margin: 9.6,
        emc: 9.3,
        level: 'dry',
        surfaceSource: 'probe',
      },
    }),
  )!;

describe('a live reading and the sensor list', () => {
  it('sets the sensor’s last seen, leaving the others, and never moves it back', () => {
    const client = new QueryClient();
    const list: SensorsResponse = {
      sensors: [sensor('new', null), sensor('old', '2026-03-02T06:00:00.000Z')],
      mqtt: null,
    };
    client.setQueryData(sensorKeys.list('s1'), list);

    applyLiveMessage(client, reading('new', '2026-03-02T06:10:00.000Z'));
    const after = client.getQueryData<SensorsResponse>(sensorKeys.list('s1'))!;
    expect(after.sensors.map((s) => s.lastSeenAt)).toEqual([
      '2026-03-02T06:10:00.000Z',
      '2026-03-02T06:00:00.000Z',
    ]);

    applyLiveMessage(client, reading('new', '2026-03-02T05:00:00.000Z'));
    expect(
      client.getQueryData<SensorsResponse>(sensorKeys.list('s1'))!.sensors[0]!.lastSeenAt,
    ).toBe('2026-03-02T06:10:00.000Z');
  });
});
