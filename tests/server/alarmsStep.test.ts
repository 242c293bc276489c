// The alarm engine judges a zone's readings in one step per batch, and hands each signal to the
// zone's alarm book only when the book can act on it (server/alarms/evaluate.ts, SignalSink).
// Both are shortcuts: the reference is the plain reading of the rules — every signal of every
// reading applied in order, and each reading judged on its own with the state stored in between
// (the way a sensor posting once a minute is judged). The sequences cross the limits the rules
// name: the wet and close levels with ingest/hysteresis.ts's confirmation, the humid limit with
// its 5 % band and holds, the battery's 2.7 V (a rule of thumb, marked so in
// ingest/alarmRules.ts), and a falling margin for the early warning (ingest/trend.ts).
import { describe, expect, it } from 'vitest';

import type { AlarmRow, NewAlarmEvent } from '@/db/queries/alarms';
import type { MarginSample } from '@/ingest';
import { createAlarmBook } from '@/server/alarms/book';
import { evaluateZone, readZoneState, type StoredReading } from '@/server/alarms/evaluate';

const MINUTE_MS = 60_000;
const WHERE = { shopId: 'shop', zoneId: 'zone' };
const SETTINGS = { limits: { cautionK: 3, wetK: 1 }, humidRhPct: 60 };
const SENSORS = ['probe-a', 'probe-b', 'air-c'];

/**
 * A zone's readings, 1–3 min apart from one of three sensors: the margin swings between dry and
 * wet, the humidity across its limit and the battery across 2.7 V, slowly enough for the holds
 * to pass and with noise enough for the runs to break.
 */
function sequence(seed: number, count: number): StoredReading[] {
  const random = () => ((seed = (seed * 48271) % 2147483647), seed / 2147483647);
  const noise = (size: number) => (random() - 0.5) * size;
  let atMs = Date.UTC(2026, 10, 2, 4, 0, 0);
  const phase = random() * 6;
  return Array.from({ length: count }, (_, k) => {
    atMs += MINUTE_MS * (1 + Math.floor(random() * 3));
    const sensorId = SENSORS[Math.floor(random() * SENSORS.length)]!;
    const marginK = 3 + 4.5 * Math.sin(phase + k / 25) + noise(1);
    return {
      sensorId,
      atMs,
      marginK: random() < 0.05 ? null : Math.round(marginK * 100) / 100,
      rhPct: Math.round((58 + 14 * Math.sin(phase + k / 37) + noise(4)) * 10) / 10,
      batteryV:
        sensorId === 'air-c'
          ? null
          : Math.round((2.76 + 0.12 * Math.sin(phase + k / 60) + noise(0.04)) * 100) / 100,
    };
  });
}

const marginsOf = (readings: StoredReading[]): MarginSample[] =>
  readings.map((r) => ({ atMs: r.atMs, marginK: r.marginK }));

/** Events and alarms with the random ids replaced by the order the alarms were opened in. */
function comparable(events: NewAlarmEvent[], alarms: AlarmRow[]) {
  const ids = new Map<string, number>();
  const idOf = (id: string) => {
    if (!ids.has(id)) ids.set(id, ids.size);
    return ids.get(id)!;
  };
  return {
    events: events.map((e) => ({ ...e, alarmId: idOf(e.alarmId) })),
    alarms: alarms.map((a) => ({ ...a, id: idOf(a.id) })).sort((a, b) => a.id - b.id),
  };
}

/** What the rules say without shortcuts: one reading at a time, every signal applied. */
function oneAtATime(readings: StoredReading[]) {
  let stored: Record<string, unknown> | null = null;
  let open: AlarmRow[] = [];
  const events: NewAlarmEvent[] = [];
  const all = new Map<string, AlarmRow>();
  for (const reading of readings) {
    const book = createAlarmBook(WHERE, open);
    const { state, signals } = evaluateZone(
      readZoneState(stored),
      WHERE.zoneId,
      [reading],
      marginsOf(readings),
      SETTINGS,
    );
    signals.forEach((s) => book.apply(s));
    // As the engine stores it: jsonb keeps what JSON keeps.
    stored = JSON.parse(JSON.stringify(state)) as Record<string, unknown>;
    const changes = book.changes();
    events.push(...changes.events);
    for (const row of [...changes.inserted, ...changes.updated]) all.set(row.id, row);
    open = [...open, ...changes.inserted].filter((row) => row.clearedAt === null);
  }
  return { stored, ...comparable(events, [...all.values()]) };
}

/** The engine's way: the whole batch in one step, signals through the book as a sink. */
function inOneStep(readings: StoredReading[]) {
  const book = createAlarmBook(WHERE, []);
  const { state, signals } = evaluateZone(
    readZoneState(null),
    WHERE.zoneId,
    readings,
    marginsOf(readings),
    SETTINGS,
    book,
  );
  const changes = book.changes();
  return {
    stored: JSON.parse(JSON.stringify(state)) as Record<string, unknown>,
    signals,
    ...comparable(changes.events, [...changes.inserted, ...changes.updated]),
  };
}

describe('judging a batch of a zone’s readings in one step', () => {
  it.each([1, 2, 3, 4, 5, 6, 7, 8])(
    'opens, updates and clears what judging them one at a time does (series %i)',
    (seed) => {
      const readings = sequence(seed * 7919, 400);
      const reference = oneAtATime(readings);
      const batch = inOneStep(readings);
      // The series must exercise the rules, or the comparison proves nothing.
      const kinds = new Set(reference.alarms.map((a) => a.kind));
      expect([...kinds].sort()).toEqual(['battery_low', 'dew_risk', 'humid_air', 'wet_surface']);
      expect(reference.events.some((e) => e.change === 'cleared')).toBe(true);
      expect(reference.events.some((e) => e.change === 'updated')).toBe(true);

      expect(batch.signals).toEqual([]);
      expect(batch.stored).toEqual(reference.stored);
      expect(batch.events).toEqual(reference.events);
      expect(batch.alarms).toEqual(reference.alarms);
    },
  );

  it('gives the book through the sink exactly what applying every signal gives', () => {
    const readings = sequence(424242, 300);
    const everySignal = createAlarmBook(WHERE, []);
    evaluateZone(
      readZoneState(null),
      WHERE.zoneId,
      readings,
      marginsOf(readings),
      SETTINGS,
    ).signals.forEach((s) => everySignal.apply(s));
    const all = everySignal.changes();
    const sunk = inOneStep(readings);
    const expected = comparable(all.events, [...all.inserted, ...all.updated]);
    expect(expected.events.length).toBeGreaterThan(10);
    expect(sunk.events).toEqual(expected.events);
    expect(sunk.alarms).toEqual(expected.alarms);
  });
});
