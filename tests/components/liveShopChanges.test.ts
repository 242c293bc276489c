// A `zones` or `sensors` live message marks that shop's list stale (so an open screen refetches
// it), and no other shop's.
import { QueryClient } from '@tanstack/react-query';
import { describe, expect, it } from 'vitest';

import { applyLiveMessage, parseLiveMessage } from '@/components/live';
import { sensorKeys, zoneKeys } from '@/components/queries';

function clientWithLists() {
  const client = new QueryClient();
  for (const shopId of ['s1', 's2']) {
    client.setQueryData(zoneKeys.list(shopId), { zones: [] });
    client.setQueryData(sensorKeys.list(shopId), { sensors: [] });
  }
  return client;
}

const stale = (client: QueryClient, key: readonly unknown[]) =>
  client.getQueryState(key)?.isInvalidated ?? false;

describe('zone and sensor change messages', () => {
  it.each(['zones', 'sensors'] as const)('parses a %s message', (type) => {
    expect(parseLiveMessage(JSON.stringify({ type, shopId: 's1' }))).toEqual({
      type,
      shopId: 's1',
    });
    expect(parseLiveMessage(JSON.stringify({ type, shopId: 7 }))).toBeNull();
  });

  it('invalidates the zone list of that shop only', () => {
    const client = clientWithLists();
    applyLiveMessage(client, parseLiveMessage(JSON.stringify({ type: 'zones', shopId: 's1' }))!);
    expect(stale(client, zoneKeys.list('s1'))).toBe(true);
    expect(stale(client, zoneKeys.list('s2'))).toBe(false);
    expect(stale(client, sensorKeys.list('s1'))).toBe(false);
  });

  it('invalidates the sensor list of that shop only', () => {
    const client = clientWithLists();
    applyLiveMessage(client, parseLiveMessage(JSON.stringify({ type: 'sensors', shopId: 's2' }))!);
    expect(stale(client, sensorKeys.list('s2'))).toBe(true);
    expect(stale(client, sensorKeys.list('s1'))).toBe(false);
    expect(stale(client, zoneKeys.list('s2'))).toBe(false);
  });
});
