/**
 * Protection trials on the wire: a shop compares 2–12 treatments of its cast iron (a wax, an
 * oil, a cover, nothing) over tests it ranks them in; the standings say which ranked best.
 */
import type { Photo } from './photos';

/** What a test exposed the treatments to, in our own words. */
export const TRIAL_TEST_KINDS = [
  'condensation',
  'standing_liquid',
  'wear',
  'humid_storage',
  'other',
] as const;
export type TrialTestKind = (typeof TRIAL_TEST_KINDS)[number];

/** A trial compares at least two treatments; twelve keeps ranking one test a human task. */
export const TRIAL_MIN_TREATMENTS = 2;
export const TRIAL_MAX_TREATMENTS = 12;

export interface TrialTreatment {
  id: string;
  name: string;
}

/** What the zone went through during the test, from its stored readings (°C, K, %, hours). */
export interface TrialTestConditions {
  readings: number;
  lowestMarginK: number | null;
  highestRhPct: number | null;
  hoursWet: number;
  /** ISO 9223 time of wetness (RH > 80 % and air > 0 °C), hours. */
  timeOfWetnessHours: number;
}

export interface TrialTest {
  id: string;
  name: string;
  kind: TrialTestKind;
  from: string;
  to: string;
  zoneId: string | null;
  sensorId: string | null;
  notes: string | null;
  /** Empty until the test is ranked; otherwise one per treatment. */
  ranks: { treatmentId: string; rank: number }[];
  /** Its photos, oldest first (ingest/wire/photos.ts). */
  photos: Photo[];
  /** Only in a trial's detail, for a test with a zone. */
  conditions?: TrialTestConditions | null;
}

export interface TrialPair {
  better: string;
  worse: string;
  z: number;
  p: number;
  adjustedP: number;
  differs: boolean;
}

export interface TrialStandings {
  /** Ranked tests only: a test counts once every treatment has its rank. */
  tests: number;
  rankTotals: { treatmentId: string; total: number; meanRank: number }[];
  friedman: { statistic: number; df: number; p: number } | null;
  kendallW: number | null;
  /** Holm-adjusted pairs, only when the Friedman p is below 0.05. */
  pairs: TrialPair[];
  verdict: string;
}

export interface TrialSummary {
  id: string;
  name: string;
  createdAt: string;
  treatments: TrialTreatment[];
  tests: number;
}

export interface Trial {
  id: string;
  name: string;
  createdAt: string;
  treatments: TrialTreatment[];
  tests: TrialTest[];
  standings: TrialStandings;
}

export interface TrialsResponse {
  trials: TrialSummary[];
}
