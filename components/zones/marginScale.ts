/**
 * Where a margin sits on the card's small bar. The bar spans the band between the wet and
 * caution limits plus the same width again on each side, so the limits always sit at one third
 * and two thirds and a dry shop's marker rests near the right end.
 */
export interface MarginScale {
  minK: number;
  maxK: number;
  /** 0..1 positions of the limits and of the (clamped) margin. */
  wetAt: number;
  cautionAt: number;
  markerAt: number | null;
}

export function marginScale(marginK: number | null, wetK: number, cautionK: number): MarginScale {
  const band = Math.max(cautionK - wetK, 0.5);
  const minK = wetK - band;
  const maxK = cautionK + band;
  const at = (k: number) => Math.min(1, Math.max(0, (k - minK) / (maxK - minK)));
  return {
    minK,
    maxK,
    wetAt: at(wetK),
    cautionAt: at(cautionK),
    markerAt: marginK === null || !Number.isFinite(marginK) ? null : at(marginK),
  };
}
