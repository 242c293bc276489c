/**
 * What a zone's card leads with, by what the zone holds.
 *
 * - machines: the dew margin of the iron — condensation on a cold top is what rusts it.
 * - lumber: the wood's EMC against the Wood Handbook's target band (ingest/emcTarget.ts) — stock
 *   moves with the air's moisture long before any surface sweats, and an air-only rack's dew
 *   margin is of an estimated surface that nobody cares about.
 * - finishing: the dew margin — a coating needs the surface clear of the dew point (ISO 8502-4's
 *   3 K before coating is the caution limit), and finishes blush on a surface near it; RH above
 *   the zone's limit, which slows drying, is highlighted on every card anyway.
 * - general: the dew margin, the one figure that says whether anything in the zone will sweat.
 */
import type { ZonePurpose } from '@/ingest/wire';

export type LeadFigure = 'margin' | 'emc';

const LEADS: Record<ZonePurpose, LeadFigure> = {
  machines: 'margin',
  lumber: 'emc',
  finishing: 'margin',
  general: 'margin',
};

export function leadFigure(purpose: ZonePurpose): LeadFigure {
  return LEADS[purpose];
}
