import { describe, expect, it } from 'vitest';

import {
  formatLastSeen,
  formatMargin,
  formatPercent,
  formatTemperature,
} from '@/components/format';

describe('formatMargin', () => {
  it.each([
    [4.24, '+4.2 °C'],
    [3, '+3.0 °C'],
    [0.04, '0.0 °C'],
    [-0.04, '0.0 °C'], // no "-0.0" flicker around zero
    [-0.8, '-0.8 °C'],
    [null, '—'],
    [undefined, '—'],
    [Number.NaN, '—'],
  ])('%s K reads %s', (marginK, expected) => {
    expect(formatMargin(marginK)).toBe(expected);
  });
});

describe('formatTemperature and formatPercent', () => {
  it.each([
    [11.84, '11.8 °C'],
    [-3.25, '-3.3 °C'],
    [null, '—'],
  ])('%s °C reads %s', (value, expected) => {
    expect(formatTemperature(value)).toBe(expected);
  });

  it('shows RH without decimals and EMC with one', () => {
    expect(formatPercent(78.5)).toBe('79 %');
    expect(formatPercent(14.24, 1)).toBe('14.2 %');
    expect(formatPercent(null)).toBe('—');
  });
});

describe('formatLastSeen', () => {
  const now = Date.parse('2026-03-02T12:00:00Z');
  it.each([
    ['2026-03-02T11:59:30Z', 'just now'],
    ['2026-03-02T12:00:05Z', 'just now'], // a sensor clock slightly ahead
    ['2026-03-02T11:58:00Z', '2 min ago'],
    ['2026-03-02T11:00:59Z', '59 min ago'],
    ['2026-03-02T09:00:00Z', '3 h ago'],
    // Older than half a day: the shop's own clock (Chicago is UTC−6 in early March).
    ['2026-03-01T18:12:00Z', '1 Mar 12:12'],
  ])('%s reads %s', (at, expected) => {
    expect(formatLastSeen(at, now, 'America/Chicago')).toBe(expected);
  });
});

describe('in Fahrenheit', () => {
  // Exact by the definition of the scale: 1 °F = 5/9 K, 32 °F = 0 °C.
  it.each([
    [3, '+5.4 °F'], // a difference only scales: 3 K = 5.4 °F, not 37.4 °F
    [-1, '-1.8 °F'],
  ])('a margin of %s K reads %s', (marginK, expected) => {
    expect(formatMargin(marginK, 'F')).toBe(expected);
  });
  it.each([
    [0, '32.0 °F'],
    [20, '68.0 °F'],
    [-40, '-40.0 °F'],
  ])('%s °C reads %s', (valueC, expected) => {
    expect(formatTemperature(valueC, 'F')).toBe(expected);
  });
});
