/**
 * Equilibrium moisture content of wood (% of oven-dry mass) from air temperature and RH.
 *
 * Source: USDA Forest Products Laboratory, Wood Handbook (FPL-GTR-190, 2010; same in the 2021
 * edition), ch. 4, eq. 4-5 — the two-hydrate Hailwood–Horrobin form fitted by Simpson (1973):
 *
 *   M = 1800/W · [ Kh/(1 − Kh) + (K1·Kh + 2·K1·K2·K²h²) / (1 + K1·Kh + K1·K2·K²h²) ]
 *
 * with h = RH/100 and W, K, K1, K2 quadratic in temperature. The handbook gives the coefficients
 * for T in °C and for T in °F; they are two separate fits, not a unit conversion of one another,
 * and agree with each other to 0.015 percentage points over −10…60 °C. Its Table 4-2 is computed
 * from this equation.
 *
 * Valid range: the table spans 30…210 °F (−1…99 °C) and 5…98 % RH. Below −1 °C the quadratics
 * are extrapolated (they stay smooth and close to the −1 °C values); above 98 % RH the result
 * approaches the fibre saturation point and the equation is not meant to be read closely.
 * Inputs that are not finite, or RH outside 0…100 %, give NaN: callers validate readings first.
 */

interface SorptionCoefficients {
  W: number;
  K: number;
  K1: number;
  K2: number;
}

/** Wood Handbook 2010, eq. 4-5, coefficients for T in °C. */
function coefficientsC(tC: number): SorptionCoefficients {
  return {
    W: 349 + 1.29 * tC + 0.0135 * tC * tC,
    K: 0.805 + 0.000736 * tC - 0.00000273 * tC * tC,
    K1: 6.27 - 0.00938 * tC - 0.000303 * tC * tC,
    K2: 1.91 + 0.0407 * tC - 0.000293 * tC * tC,
  };
}

/** Wood Handbook 2010, eq. 4-5, coefficients for T in °F. */
function coefficientsF(tF: number): SorptionCoefficients {
  return {
    W: 330 + 0.452 * tF + 0.00415 * tF * tF,
    K: 0.791 + 0.000463 * tF - 0.000000844 * tF * tF,
    K1: 6.34 + 0.000775 * tF - 0.0000935 * tF * tF,
    K2: 1.09 + 0.0284 * tF - 0.0000904 * tF * tF,
  };
}

function hailwoodHorrobin(rhPct: number, { W, K, K1, K2 }: SorptionCoefficients): number {
  if (!(rhPct >= 0 && rhPct <= 100)) return Number.NaN;
  const kh = (K * rhPct) / 100;
  const k1kh = K1 * kh;
  const k1k2kh2 = K1 * K2 * kh * kh;
  return (1800 / W) * (kh / (1 - kh) + (k1kh + 2 * k1k2kh2) / (1 + k1kh + k1k2kh2));
}

/** EMC, % of oven-dry mass, from air temperature in °C (the °C coefficients). */
export function emcPct(airC: number, rhPct: number): number {
  if (!Number.isFinite(airC)) return Number.NaN;
  return hailwoodHorrobin(rhPct, coefficientsC(airC));
}

/** EMC, % of oven-dry mass, from air temperature in °F (the handbook's °F coefficients). */
export function emcPctF(airF: number, rhPct: number): number {
  if (!Number.isFinite(airF)) return Number.NaN;
  return hailwoodHorrobin(rhPct, coefficientsF(airF));
}
