/**
 * Estimated surface temperatures for sensors without a surface probe. The lag state lives in
 * memory per sensor; when it is missing (a restart, another instance took the earlier posts) or
 * a batch reaches back before it (a sensor's backlog), it is rebuilt from the stored air
 * readings of the three time constants before the batch — after 3τ an old start is forgotten
 * to within 5 %.
 */
import type { Db } from '@/db';
import { airSamplesOfSensor } from '@/db/queries/readings';
import {
  DEFAULT_SURFACE_ESTIMATE,
  estimateSurfaceSeries,
  stepSurfaceEstimate,
  type AirSample,
  type SurfaceEstimateOptions,
  type SurfaceEstimateState,
} from '@/ingest';

export interface SurfaceEstimator {
  /** Surface estimates (°C) for time-ordered air samples of one sensor, in the same order. */
  estimate(sensorId: string, samples: AirSample[]): Promise<number[]>;
}

export function createSurfaceEstimator(
  db: Db,
  options: SurfaceEstimateOptions = DEFAULT_SURFACE_ESTIMATE,
): SurfaceEstimator {
  const states = new Map<string, SurfaceEstimateState>();
  // One batch at a time per sensor, so two requests never step the same state at once.
  const chains = new Map<string, Promise<unknown>>();

  async function run(sensorId: string, samples: AirSample[]): Promise<number[]> {
    const first = samples[0]!;
    let state = states.get(sensorId) ?? null;
    if (!state || first.atMs <= state.atMs || first.atMs - state.atMs > options.maxGapMs) {
      state = await stateBefore(db, sensorId, first.atMs, options);
    }
    const surfaces: number[] = [];
    for (const sample of samples) {
      state = stepSurfaceEstimate(state, sample, options);
      surfaces.push(state?.surfaceC ?? sample.airC);
    }
    const known = states.get(sensorId);
    if (state && (!known || state.atMs >= known.atMs)) states.set(sensorId, state);
    return surfaces;
  }

  return {
    estimate(sensorId, samples) {
      if (samples.length === 0) return Promise.resolve([]);
      const previous = chains.get(sensorId) ?? Promise.resolve();
      const next = previous.catch(() => {}).then(() => run(sensorId, samples));
      chains.set(sensorId, next);
      void next
        .finally(() => {
          if (chains.get(sensorId) === next) chains.delete(sensorId);
        })
        .catch(() => {});
      return next;
    },
  };
}

/**
 * One sensor's surface estimate stepped sample by sample in time order, started (as `estimate`
 * starts a sensor it has no state for) from the stored air readings of the three time constants
 * before `firstAtMs`. The import streams its rows through it rather than holding them for one
 * `estimate` call; the surfaces are the same numbers.
 */
export async function startSurfaceSeries(
  db: Db,
  sensorId: string,
  firstAtMs: number,
  options: SurfaceEstimateOptions = DEFAULT_SURFACE_ESTIMATE,
): Promise<(sample: AirSample) => number> {
  let state = await stateBefore(db, sensorId, firstAtMs, options);
  return (sample) => {
    state = stepSurfaceEstimate(state, sample, options);
    return state?.surfaceC ?? sample.airC;
  };
}

/** The estimate's state just before `atMs`, rebuilt from the stored readings of 3τ before it. */
async function stateBefore(
  db: Db,
  sensorId: string,
  atMs: number,
  options: SurfaceEstimateOptions,
): Promise<SurfaceEstimateState | null> {
  const history = await airSamplesOfSensor(
    db,
    sensorId,
    new Date(atMs - 3 * options.tauS * 1000),
    new Date(atMs),
  );
  return estimateSurfaceSeries(history, options).at(-1) ?? null;
}
