/**
 * Micro-benchmark of the per-reading science: dew (or frost) point, dew margin, EMC and level.
 * Prints readings per second on one core; the target is at least 1 million. A printout, not a
 * test: timings vary by machine. Run with `npx tsx scripts/bench-ingest-math.ts`.
 */
import { emcPct } from '../ingest/emc';
import { DEFAULT_LIMITS, dewMarginK, levelFor, type Level } from '../ingest/levels';
import { dewPoint } from '../ingest/psychrometrics';

const READINGS = 1_000_000;
const ROUNDS = 5;

/** Deterministic shop-like readings: air −10…40 °C, RH 5…100 %, surface within ±5 K of the air. */
function makeReadings(count: number): Float64Array {
  const values = new Float64Array(count * 3);
  let seed = 12345;
  const next = () => {
    // Park–Miller minimal standard generator: repeatable without a dependency.
    seed = (seed * 48271) % 2147483647;
    return seed / 2147483647;
  };
  for (let i = 0; i < count; i++) {
    const airC = -10 + 50 * next();
    values[i * 3] = airC;
    values[i * 3 + 1] = 5 + 95 * next();
    values[i * 3 + 2] = airC - 5 + 10 * next();
  }
  return values;
}

function deriveAll(values: Float64Array, count: number): number {
  // Accumulate something from every result so the work cannot be optimised away.
  let checksum = 0;
  const levels: Record<Level, number> = { dry: 0, close: 0, wet: 0, unknown: 0 };
  for (let i = 0; i < count; i++) {
    const airC = values[i * 3]!;
    const rhPct = values[i * 3 + 1]!;
    const surfaceC = values[i * 3 + 2]!;
    const dew = dewPoint(airC, rhPct);
    const marginK = dewMarginK(surfaceC, dew.ok ? dew.dewPointC : null);
    const emc = emcPct(airC, rhPct);
    levels[levelFor(marginK, DEFAULT_LIMITS)]++;
    checksum += (marginK ?? 0) + emc;
  }
  return checksum + levels.wet;
}

const values = makeReadings(READINGS);
deriveAll(values, 100_000); // warm-up, so the optimising compiler has run

let best = 0;
let checksum = 0;
for (let round = 0; round < ROUNDS; round++) {
  const startMs = performance.now();
  checksum += deriveAll(values, READINGS);
  const elapsedMs = performance.now() - startMs;
  best = Math.max(best, READINGS / (elapsedMs / 1000));
}

const perSecond = Math.round(best).toLocaleString('en-US');
console.log(`ingest math: ${perSecond} readings/s (best of ${ROUNDS} × ${READINGS} readings)`);
console.log(`checksum ${checksum.toFixed(3)}`);
