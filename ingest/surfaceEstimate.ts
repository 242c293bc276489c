/**
 * Estimated surface temperature of a machine top that has no surface probe.
 *
 * Model: a first-order lag (a lumped thermal mass exchanging heat with the air),
 *
 *   Ts ← Ta + (Ts − Ta) · exp(−Δt / τ)
 *
 * applied reading by reading over irregular intervals. It is the exact solution of
 * dTs/dt = (Ta − Ts)/τ when the air temperature over the interval equals the reading that ends
 * it; exp(−a)·exp(−b) = exp(−(a+b)), so splitting an interval does not change the result.
 *
 * The default τ, derived (numbers are typical handbook values quoted from memory):
 * - grey cast iron: density ≈ 7200 kg/m³, specific heat ≈ 460 J/(kg·K) (ASM Metals Handbook
 *   figures for class 30 grey iron);
 * - a cabinet-saw top of about 0.69 × 0.51 m weighs about 40 kg with its ribs, i.e. 115 kg per m²
 *   of top, an equivalent solid thickness of 16 mm;
 * - heat stored per m² of top and kelvin: 7200 × 460 × 0.016 ≈ 53 000 J/(m²·K);
 * - natural convection at a 3 K difference, plate length A/P ≈ 0.15 m, air at 20 °C:
 *   Ra = gβΔT·L³/(να) ≈ 1.1·10⁶. Upper face of a cold plate (the stable case when the shop warms):
 *   Nu = 0.52 Ra^(1/5) ≈ 8.4, h ≈ 1.5 W/(m²·K). Underside (the unstable case): Nu = 0.54 Ra^(1/4)
 *   ≈ 17, h ≈ 3.0 W/(m²·K) (Incropera, Fundamentals of Heat and Mass Transfer, 7th ed.,
 *   eqs. 9.30 and 9.32). Together ≈ 4.5 W/(m²·K) per m² of top; the ribs add area but sit in
 *   sheltered air, and radiation is left out because the walls it exchanges with lag the air too;
 * - τ = 53 000 / 4.5 ≈ 11 800 s ≈ 3.3 h, rounded to 3 h.
 * A thin band-saw table in moving air is nearer 1 h, a jointer bed with wings longer; set τ per
 * surface. Valid where the top is thin enough to be one temperature (Biot number
 * h·L/k ≈ 4.5 × 0.016 / 50 ≈ 0.001, far below 0.1) and the air is the main heat path (no sun,
 * no heater blowing on the top).
 *
 * After a gap longer than `maxGapMs` the estimate restarts at the air temperature: we do not know
 * what the air did meanwhile. The trap: a restart is optimistic during a warm-up (it says the iron
 * is as warm as the air), so the state carries `startedAtMs` for callers to weigh a young estimate.
 */

export const DEFAULT_SURFACE_TAU_S = 3 * 60 * 60;

/**
 * Two hours: longer than the slowest sensor interval we expect (15 min) by far, short enough that
 * holding one air reading across the gap is not a wild guess (the lag moves 1 − e^(−2/3) ≈ 49 %
 * of the way in that time). A silent sensor raises its own alarm long before this.
 */
export const DEFAULT_SURFACE_MAX_GAP_MS = 2 * 60 * 60 * 1000;

export interface SurfaceEstimateOptions {
  /** Time constant of the surface, seconds; must be positive. */
  tauS: number;
  /** Longest interval bridged by the lag; a longer one restarts at the air temperature. */
  maxGapMs: number;
}

export const DEFAULT_SURFACE_ESTIMATE: SurfaceEstimateOptions = {
  tauS: DEFAULT_SURFACE_TAU_S,
  maxGapMs: DEFAULT_SURFACE_MAX_GAP_MS,
};

export interface AirSample {
  atMs: number;
  airC: number;
}

/** What the server persists per surface, and what it rebuilds from stored readings. */
export interface SurfaceEstimateState {
  atMs: number;
  surfaceC: number;
  /** The air reading that produced this state. */
  airC: number;
  /** When the estimate last (re)started from the air temperature. */
  startedAtMs: number;
  source: 'estimate';
}

function restart(sample: AirSample): SurfaceEstimateState {
  return {
    atMs: sample.atMs,
    surfaceC: sample.airC,
    airC: sample.airC,
    startedAtMs: sample.atMs,
    source: 'estimate',
  };
}

/**
 * One step of the lag. A sample that is not later than the state (a duplicate or out-of-order
 * reading) or has no finite values leaves the state unchanged, so replaying stored readings is
 * safe; a null state starts at the sample's air temperature.
 */
export function stepSurfaceEstimate(
  state: SurfaceEstimateState,
  sample: AirSample,
  options?: SurfaceEstimateOptions,
): SurfaceEstimateState;
export function stepSurfaceEstimate(
  state: SurfaceEstimateState | null,
  sample: AirSample,
  options?: SurfaceEstimateOptions,
): SurfaceEstimateState | null;
export function stepSurfaceEstimate(
  state: SurfaceEstimateState | null,
  sample: AirSample,
  options: SurfaceEstimateOptions = DEFAULT_SURFACE_ESTIMATE,
): SurfaceEstimateState | null {
  if (!(options.tauS > 0)) throw new RangeError('tauS must be a positive number of seconds');
  if (!Number.isFinite(sample.atMs) || !Number.isFinite(sample.airC)) return state;
  if (state === null) return restart(sample);
  const intervalMs = sample.atMs - state.atMs;
  if (!(intervalMs > 0)) return state;
  if (intervalMs > options.maxGapMs) return restart(sample);
  const decay = Math.exp(-intervalMs / 1000 / options.tauS);
  return {
    atMs: sample.atMs,
    surfaceC: sample.airC + (state.surfaceC - sample.airC) * decay,
    airC: sample.airC,
    startedAtMs: state.startedAtMs,
    source: 'estimate',
  };
}

/** Fold a time-ordered series, e.g. to rebuild the state from stored readings. */
export function estimateSurfaceSeries(
  samples: readonly AirSample[],
  options: SurfaceEstimateOptions = DEFAULT_SURFACE_ESTIMATE,
  initial: SurfaceEstimateState | null = null,
): SurfaceEstimateState[] {
  const states: SurfaceEstimateState[] = [];
  let state = initial;
  for (const sample of samples) {
    const next = stepSurfaceEstimate(state, sample, options);
    if (next !== null && next !== state) states.push(next);
    state = next;
  }
  return states;
}
