// The overview's risk order and the level strip's counts (components/zones/zoneOrder.ts).
import { describe, expect, it } from 'vitest';

import { countByLevel, orderByRisk, type RiskRanked } from '@/components/zones/zoneOrder';
import type { Level } from '@/ingest/wire';

const zone = (name: string, level: Level | null, margin: number | null = null): RiskRanked => ({
  name,
  latest: level === null ? null : { level, margin },
});

describe('orderByRisk', () => {
  it('puts wet first, then close, then the rest by margin ascending', () => {
    const zones = [
      zone('Machine room', 'dry', 8.3),
      zone('Lumber rack', 'dry', 4.1),
      zone('Spray booth', 'close', 2.2),
      zone('Bench room', 'wet', 0.4),
      zone('Finishing room', 'close', 1.6),
      zone('Garage', 'wet', -2.7),
    ];
    expect(orderByRisk(zones).map((z) => z.name)).toEqual([
      'Garage',
      'Bench room',
      'Finishing room',
      'Spray booth',
      'Lumber rack',
      'Machine room',
    ]);
  });

  it('breaks ties of level and margin by name', () => {
    const zones = [zone('b', 'dry', 5), zone('C', 'dry', 5), zone('a', 'dry', 5)];
    expect(orderByRisk(zones).map((z) => z.name)).toEqual(['a', 'b', 'C']);
  });

  it('puts zones without a margin or a reading last, by name', () => {
    const zones = [
      zone('New zone', null),
      zone('Air only', 'unknown', null),
      zone('Machine room', 'dry', 12),
    ];
    expect(orderByRisk(zones).map((z) => z.name)).toEqual(['Machine room', 'Air only', 'New zone']);
  });

  it('leaves the given list as it was', () => {
    const zones = [zone('Machine room', 'dry', 8), zone('Bench room', 'wet', 0.2)];
    orderByRisk(zones);
    expect(zones.map((z) => z.name)).toEqual(['Machine room', 'Bench room']);
  });

  // The level outranks the margin: a wet zone whose margin is above a close one's (limits
  // differ per zone) still comes first.
  it('ranks by level before margin', () => {
    const zones = [zone('Tight limits', 'close', 0.5), zone('Loose limits', 'wet', 1.5)];
    expect(orderByRisk(zones).map((z) => z.name)).toEqual(['Loose limits', 'Tight limits']);
  });
});

describe('countByLevel', () => {
  it('counts wet, close and dry, worst first, zeros included', () => {
    const zones = [
      zone('a', 'wet', 0),
      zone('b', 'wet', 0.5),
      zone('c', 'close', 2),
      zone('d', 'dry', 5),
      zone('e', 'dry', 6),
      zone('f', 'dry', 7),
    ];
    expect(countByLevel(zones)).toEqual([
      { level: 'wet', count: 2 },
      { level: 'close', count: 1 },
      { level: 'dry', count: 3 },
    ]);
    expect(countByLevel([zone('a', 'dry', 5)])).toEqual([
      { level: 'wet', count: 0 },
      { level: 'close', count: 0 },
      { level: 'dry', count: 1 },
    ]);
  });

  it('lists unknown only when some zone has no margin', () => {
    expect(countByLevel([zone('a', 'dry', 5), zone('b', null)])).toContainEqual({
      level: 'unknown',
      count: 1,
    });
  });
});
