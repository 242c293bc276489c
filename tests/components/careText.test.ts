// The care screens' words and sums: a surface's state against its coat's budget (a word, never
// colour alone), hours and ages as read on screen, the ISO 4628-3 degree of rusting named with
// the standard, surfaces grouped by zone, the chart's span and marks, which budgets a save sends
// (defaults left alone stay defaults, said to be rules of thumb), and a live reading refetching
// only the exposures of its own zone.
import { QueryClient } from '@tanstack/react-query';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { afterEach, describe, expect, it, vi } from 'vitest';

import { budgetFieldOf, budgetsToSend, budgetValues } from '@/components/care/budgetForm';
import {
  careEntryTitle,
  careMarks,
  chartHours,
  formatAge,
  formatHours,
  groupByZone,
  marksLine,
  recoatState,
} from '@/components/care/careText';
import { RecoatMark } from '@/components/care/ExposureFigures';
import {
  EXPOSURE_COALESCE_MS,
  invalidateZoneExposures,
  surfaceKeys,
  type CareEntry,
  type CoatingBudget,
  type Surface,
  type SurfaceExposure,
} from '@/components/queries';
import { DEFAULT_COATING_BUDGETS } from '@/ingest/care';

const HOUR_MS = 3_600_000;
const NOW = Date.parse('2026-03-10T12:00:00Z');

function exposure(over: Partial<SurfaceExposure>): SurfaceExposure {
  return {
    since: '2026-03-10T10:00:00Z',
    coating: 'wax',
    hoursClose: 0,
    hoursWet: 0,
    timeOfWetnessHours: 0,
    recoat: { due: false, reason: '', cautions: [] },
    ...over,
  };
}

function entry(over: Partial<CareEntry>): CareEntry {
  return {
    id: 'e',
    kind: 'coating',
    at: '2026-03-10T10:00:00Z',
    by: { id: 'u', name: 'Ines Joiner' },
    coating: { type: 'wax', product: null },
    rusting: null,
    note: null,
    photos: [],
    ...over,
  };
}

function surface(id: string, zoneId: string, name: string): Surface {
  return { id, zoneId, name, material: null, sensorId: null, createdAt: '2026-03-01T00:00:00Z' };
}

describe('re-coat state', () => {
  // The server says `due` for no coat as well (ingest/care.ts recoatCause 'no_coat'); the screen
  // tells the two apart so "No coat logged" is not read as worn through.
  it.each([
    {
      name: 'no coat',
      e: exposure({ since: null, recoat: { due: true, reason: '', cautions: [] } }),
      state: 'none',
      word: 'No coat logged',
    },
    {
      name: 'budget passed',
      e: exposure({ recoat: { due: true, reason: '', cautions: [] } }),
      state: 'due',
      word: 'Re-coat due',
    },
    { name: 'within budget', e: exposure({}), state: 'ok', word: 'Within budget' },
  ])('$name → $word, as text', ({ e, state, word }) => {
    expect(recoatState(e)).toBe(state);
    const html = renderToStaticMarkup(createElement(RecoatMark, { exposure: e }));
    expect(html).toContain(`>${word}<`);
  });
});

describe('hours and ages', () => {
  // Exposure hours as the week report's rule gives them (each reading stands until the next, at
  // most 15 min): 3 readings 10 min apart = 10 + 10 + 15 = 35 min; 6 = 5 × 10 + 15 = 65 min.
  it.each([
    { hours: 35 / 60, text: '0.6 h' }, // 0.5833 rounds up
    { hours: 65 / 60, text: '1.1 h' }, // 1.0833 rounds down
    { hours: 0, text: '0.0 h' },
    { hours: 4, text: '4.0 h' }, // the default wax wet budget, a rule of thumb (ingest/care.ts)
    { hours: null, text: '—' },
  ])('$hours h reads $text', ({ hours, text }) => {
    expect(formatHours(hours)).toBe(text);
  });

  it.each([
    { ageMs: 30_000, text: 'just now' },
    { ageMs: 59 * 60_000, text: '59 min ago' },
    { ageMs: 2 * HOUR_MS + 59 * 60_000, text: '2 h ago' },
    { ageMs: 47 * HOUR_MS, text: '47 h ago' },
    { ageMs: 50 * HOUR_MS, text: '2 days ago' },
    { ageMs: -60_000, text: 'just now' }, // a coat logged a minute ahead of this clock
  ])('a coat $ageMs ms old was put on $text', ({ ageMs, text }) => {
    expect(formatAge(new Date(NOW - ageMs).toISOString(), NOW)).toBe(text);
  });
});

describe('care entries in words', () => {
  it('names the coat type in our own words and the product as the shop wrote it', () => {
    expect(careEntryTitle(entry({ coating: { type: 'dry_film', product: 'Blue can' } }))).toBe(
      'Coat · Dry-film lubricant · Blue can',
    );
  });

  // ISO 4628-3 grades the degree of rusting Ri 0 to Ri 5 by rusted share of the area; the shares
  // in the words (Ri 1 ≈ 0.05 %, Ri 3 ≈ 1 %, Ri 5 40–50 %) are from memory (ingest/words/care.ts).
  it.each([
    { ri: 0, text: 'Inspection · Ri 0 — no rust to be seen (ISO 4628-3)' },
    {
      ri: 1,
      text: 'Inspection · Ri 1 — a few pinpoints of rust (about 0.05 % of the area) (ISO 4628-3)',
    },
    {
      ri: 5,
      text: 'Inspection · Ri 5 — rust over much of the surface (about 40–50 % of the area) (ISO 4628-3)',
    },
  ] as const)('Ri $ri names the standard', ({ ri, text }) => {
    expect(careEntryTitle(entry({ kind: 'inspection', coating: null, rusting: ri }))).toBe(text);
  });
});

describe('surfaces by zone', () => {
  it('keeps the zones in order, sorts each zone by name and leaves out empty zones', () => {
    const zones = [{ id: 'z1' }, { id: 'z2' }, { id: 'z3' }];
    const groups = groupByZone(zones, [
      surface('a', 'z3', 'Jointer beds'),
      surface('b', 'z1', 'Table saw top'),
      surface('c', 'z3', 'Band saw table'),
    ]);
    expect(groups.map((g) => [g.zone.id, g.surfaces.map((s) => s.name)])).toEqual([
      ['z1', ['Table saw top']],
      ['z3', ['Band saw table', 'Jointer beds']],
    ]);
  });
});

describe('the surface chart', () => {
  it.each([
    { name: 'no entries', ages: [], hours: 6 },
    { name: 'a coat 2 h back', ages: [2], hours: 6 }, // 2 + 1 < 6
    { name: 'a coat 10.5 h back', ages: [10.5, 1], hours: 12 }, // ceil(10.5) + 1
    { name: 'a coat 40 days back', ages: [40 * 24], hours: 720 }, // capped at 30 days
  ])('$name → $hours h', ({ ages, hours }) => {
    const entries = ages.map((h) => ({ at: new Date(NOW - h * HOUR_MS).toISOString() }));
    expect(chartHours(entries, NOW)).toBe(hours);
  });

  it('marks the entries inside the span, oldest first', () => {
    const marks = careMarks(
      [
        entry({
          id: '3',
          kind: 'inspection',
          coating: null,
          rusting: 0,
          at: '2026-03-10T11:00:00Z',
        }),
        entry({ id: '2', at: '2026-03-10T09:00:00Z' }),
        entry({ id: '1', at: '2026-03-01T09:00:00Z' }), // before the span
      ],
      NOW - 6 * HOUR_MS,
      NOW,
    );
    expect(marks.map((m) => [new Date(m.atMs).toISOString(), m.kind])).toEqual([
      ['2026-03-10T09:00:00.000Z', 'coating'],
      ['2026-03-10T11:00:00.000Z', 'inspection'],
    ]);
    expect(marksLine(2, true)).toBe('2 care entries marked: ▲ coat, ◆ inspection.');
    expect(marksLine(1, false)).toBe(
      '1 care entry in this span, but no readings to draw them over.',
    );
  });
});

describe('saving the coating budgets', () => {
  const budgets: CoatingBudget[] = (['wax', 'oil'] as const).map((coating) => ({
    coating,
    ...DEFAULT_COATING_BUDGETS[coating],
    isDefault: coating === 'wax',
  }));

  it('sends the shop’s own rows and changed defaults, not defaults left alone', () => {
    const values = budgetValues(budgets);
    expect(budgetsToSend(budgets, values).map((b) => b.coating)).toEqual(['oil']);
    const changed = { ...values, 'wax:hoursWet': '1,5' }; // a decimal comma, as typed
    expect(budgetsToSend(budgets, changed)).toEqual([
      { coating: 'wax', hoursWet: 1.5, hoursClose: 72, towHours: 500 },
      { coating: 'oil', ...DEFAULT_COATING_BUDGETS.oil },
    ]);
  });

  it('puts the server’s message on the field of the row it names', () => {
    const sent = [{ coating: 'oil' as const }, { coating: 'wax' as const }];
    expect(budgetFieldOf('budgets.1.towHours', sent)).toBe('wax:towHours');
    expect(budgetFieldOf('budgets.2.towHours', sent)).toBeUndefined();
    expect(budgetFieldOf('budgets', sent)).toBeUndefined();
  });
});

describe('live readings', () => {
  afterEach(() => {
    vi.useRealTimers();
  });

  it('make the exposures of their own zone stale, and no other, once per burst', async () => {
    vi.useFakeTimers();
    const client = new QueryClient();
    const a = surfaceKeys.exposure('shop', { id: 's1', zoneId: 'zA' });
    const b = surfaceKeys.exposure('shop', { id: 's2', zoneId: 'zB' });
    client.setQueryData(a, exposure({}));
    client.setQueryData(b, exposure({}));
    const invalidate = vi.spyOn(client, 'invalidateQueries');
    // Three readings of one burst in zone A.
    invalidateZoneExposures(client, 'shop', 'zA');
    invalidateZoneExposures(client, 'shop', 'zA');
    invalidateZoneExposures(client, 'shop', 'zA');
    expect(client.getQueryState(a)?.isInvalidated).toBe(false);
    await vi.advanceTimersByTimeAsync(EXPOSURE_COALESCE_MS);
    expect(client.getQueryState(a)?.isInvalidated).toBe(true);
    expect(client.getQueryState(b)?.isInvalidated).toBe(false);
    expect(invalidate).toHaveBeenCalledTimes(1);
    // A reading after the burst is a new burst.
    invalidateZoneExposures(client, 'shop', 'zA');
    await vi.advanceTimersByTimeAsync(EXPOSURE_COALESCE_MS);
    expect(invalidate).toHaveBeenCalledTimes(2);
  });
});
