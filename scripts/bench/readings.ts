/**
 * Reading payloads for the load: every reading gets a time no other reading of the run has, so
 * none is dropped as a duplicate and every phase really inserts. Values wander like a dry shop's
 * (air 12–24 °C, RH 35–60 %, the iron up to 1 K colder than the air, so the dew margin stays
 * above 5 K): the alarm engine judges every batch but opens no alarm, as on most days. Every
 * reading carries a surface value, so the probe path is measured; the estimate path (a database
 * read when a sensor's lag state is cold) is not.
 */
import { deriveReading, type Derived } from '@/ingest';

export interface BenchReading {
  at: string;
  air: number;
  rh: number;
  surface: number;
  battery: number;
}

export interface ReadingSource {
  next(): BenchReading;
  /** `n` readings as the batch body `{ unit, readings }`. */
  batchBody(n: number): string;
  /** One reading as the single-object body. */
  singleBody(): string;
}

/**
 * Times step by one second from `startMs`. A run inserts well under a million readings, i.e.
 * under 12 days of seconds, so a start 60 days back keeps every time in the past and inside
 * the contract's 5-minute future limit.
 */
export function createReadingSource(startMs = Date.now() - 60 * 24 * 3600 * 1000): ReadingSource {
  let atMs = Math.floor(startMs / 1000) * 1000;
  let seed = 12345;
  const random = () => {
    // Park–Miller: repeatable values without a dependency.
    seed = (seed * 48271) % 2147483647;
    return seed / 2147483647;
  };
  const next = (): BenchReading => {
    atMs += 1000;
    const air = round2(12 + 12 * random());
    return {
      at: new Date(atMs).toISOString(),
      air,
      rh: round2(35 + 25 * random()),
      surface: round2(air - random()),
      battery: 3.1,
    };
  };
  return {
    next,
    batchBody: (n) => JSON.stringify({ unit: 'C', readings: Array.from({ length: n }, next) }),
    singleBody: () => JSON.stringify(next()),
  };
}

const round2 = (v: number) => Math.round(v * 100) / 100;

/** What the server would store for a reading, for the raw INSERT baseline. */
export function derivedOf(r: BenchReading): Derived {
  return deriveReading({ airC: r.air, rhPct: r.rh, surfaceC: r.surface });
}
