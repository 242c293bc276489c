/**
 * A believable day in an invented, unheated shop, for the demo sensors only: a cold night, a
 * heater switched on at 07:00 while mild, humid air comes in (the morning sweat on the iron),
 * a dry afternoon and a cooling evening. Not a physical model of any real building.
 */
import { dewPoint } from '@/ingest';

export type DemoProfile = 'machine-room' | 'lumber-rack' | 'finishing-room';

const HOUR_MS = 3_600_000;

function hourOfDay(atMs: number, utcOffsetHours: number): number {
  const h = (atMs / HOUR_MS + utcOffsetHours) % 24;
  return h < 0 ? h + 24 : h;
}

/** Smooth step from 0 to 1 between hours a and b. */
function ramp(h: number, a: number, b: number): number {
  if (h <= a) return 0;
  if (h >= b) return 1;
  const x = (h - a) / (b - a);
  return x * x * (3 - 2 * x);
}

/** Air temperature (°C) and the air's dew point (°C) at an instant. */
export function demoAir(profile: DemoProfile, atMs: number, utcOffsetHours: number) {
  const h = hourOfDay(atMs, utcOffsetHours);
  const heaterOn = ramp(h, 7, 7.75) - ramp(h, 17, 19);
  const base = 5 + 2.5 * Math.sin(((h - 9) / 24) * 2 * Math.PI);
  const warmth = profile === 'lumber-rack' ? 5 : profile === 'finishing-room' ? 9 : 11;
  const airC = base + warmth * heaterOn;
  // Moist air arrives with the morning (doors open, a wet spell outside) and dries by noon.
  const morningMoisture = ramp(h, 6.5, 7.5) - ramp(h, 10, 13);
  // Winter night air is dry enough (dew near −2 °C) that the iron stays clear until morning.
  const dewC =
    -2 + (profile === 'finishing-room' ? 1 : 0) + 11 * morningMoisture - 2 * ramp(h, 13, 16);
  return { airC, dewC: Math.min(dewC, airC) };
}

/** RH (%) of air at `airC` whose dew point is `dewC`, by bisection on ingest's dew point. */
export function rhFromDewPoint(airC: number, dewC: number): number {
  let lo = 1;
  let hi = 100;
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    const d = dewPoint(airC, mid);
    if (d.ok && d.dewPointC < dewC) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * Iron follows the air as a first-order lag; τ of 2.5 h is in the range of a heavy cast-iron
 * table top in still air (demo value, not a measurement).
 */
export function stepIron(ironC: number, airC: number, dtMs: number, tauMs = 2.5 * HOUR_MS): number {
  return airC + (ironC - airC) * Math.exp(-dtMs / tauMs);
}
