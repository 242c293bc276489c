// The alarm card and the zone readings rendered to HTML by react-dom/server through
// react-native-web, as the web bundle renders them: the card's advice and safety cautions are
// ingest/words' (the same the alarm e-mails carry), its margins follow the person's unit, and a
// dew point below 0.01 °C is labelled a frost point (ingest/psychrometrics.ts).
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';

import { AlarmCard } from '@/components/alarms/AlarmCard';
import type { Alarm, Zone } from '@/components/queries';
import { ZoneReadings } from '@/components/zones/ZoneReadings';
import { ALARM_KINDS } from '@/ingest/alarmKinds';
import { ALARM_ADVICE } from '@/ingest/words';

const NOW_MS = Date.parse('2026-01-14T14:00:00Z');

const alarm = (extra: Partial<Alarm> = {}): Alarm => ({
  id: 'a1',
  kind: 'wet_surface',
  state: 'open',
  zone: { id: 'z1', name: 'Machine room' },
  sensor: { id: 's1', name: 'Saw probe' },
  sinceAt: '2026-01-14T12:40:00Z',
  openedAt: '2026-01-14T12:40:00Z',
  updatedAt: '2026-01-14T12:40:00Z',
  clearedAt: null,
  worstMarginK: -0.6,
  latestMarginK: -0.5,
  minutesToWet: null,
  peakRhPct: 71,
  latestRhPct: 71,
  lowestBatteryV: 2.6,
  latestBatteryV: 2.6,
  acknowledgement: null,
  ...extra,
});

function renderCard(a: Alarm, unit: 'C' | 'F' = 'C', adviceFolded = false, zone?: Zone): string {
  return renderToStaticMarkup(
    createElement(AlarmCard, {
      shopId: 'shop1',
      alarm: a,
      nowMs: NOW_MS,
      timeZone: 'America/Chicago',
      canAcknowledge: false,
      unit,
      adviceFolded,
      zone,
    }),
  );
}

const decode = (html: string) =>
  html
    .replace(/&#x27;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');

/** The text of every element with this test id, in order. */
function textsOf(html: string, testId: string): string[] {
  const re = new RegExp(`data-testid="${testId}"[^>]*>([^<]*)<`, 'g');
  return [...html.matchAll(re)].map((m) => decode(m[1]!));
}

describe('the alarm card', () => {
  it.each(ALARM_KINDS)('%s: shows ingest’s steps and cautions under a Safety heading', (kind) => {
    const html = renderCard(alarm({ kind }));
    const { steps, cautions } = ALARM_ADVICE[kind];
    expect(textsOf(html, 'alarm-step')).toEqual(steps);
    expect(textsOf(html, 'alarm-caution')).toEqual(cautions);
    // The cautions stand apart by a heading in words, not by colour alone.
    expect(html).toMatch(/data-testid="alarm-safety"[^>]*>(<[^>]+>)*Safety</);
  });

  it('carries the unplug, label, ventilation, rag and heater cautions on a wet surface', () => {
    const cautions = textsOf(renderCard(alarm()), 'alarm-caution').join(' ');
    expect(cautions).toMatch(/unplug the machine before wiping near a blade or cutterhead/);
    expect(cautions).toMatch(/safety data sheet/);
    expect(cautions).toMatch(/aerosols are flammable/);
    expect(cautions).toMatch(/Oily rags/);
    expect(cautions).toMatch(/carbon monoxide/);
  });

  it('folds a repeated kind’s advice into one button that unfolds steps and cautions together', () => {
    const html = renderCard(alarm(), 'C', true);
    expect(textsOf(html, 'alarm-step')).toEqual([]);
    expect(textsOf(html, 'alarm-caution')).toEqual([]);
    expect(html).toContain('data-testid="alarm-advice-open"');
    expect(html).toContain('What to do, and safety');
  });

  it('shows no advice once the alarm has cleared', () => {
    const html = renderCard(alarm({ state: 'cleared', clearedAt: '2026-01-14T13:30:00Z' }));
    expect(textsOf(html, 'alarm-step')).toEqual([]);
    expect(html).not.toContain('alarm-safety');
  });

  it('writes margins in the person’s unit: a difference in °F only scales', () => {
    const html = renderCard(alarm(), 'F');
    expect(textsOf(html, 'alarm-headline')).toEqual(['Machine room: wet, margin -0.9 °F']);
    expect(html).toContain('Worst margin -1.1 °F');
    expect(html).not.toContain('°C');
  });

  // The zone dried since the alarm's last change: the card says so beside the worst, and what
  // clears it, in °F (1 K = 1.8 °F, no offset; the rule's numbers are ALARM_RULE_NUMBERS').
  it('shows the zone’s margin now beside the worst, and the rule that clears it', () => {
    const zone: Zone = {
      id: 'z1',
      name: 'Machine room',
      cautionK: 3,
      wetK: 1,
      humidRhPct: 60,
      purpose: 'machines',
      emcRegion: 'most',
      staleAfterS: 900,
      latest: {
        at: '2026-01-14T13:55:00Z',
        air: 18,
        rh: 50,
        surface: 16,
        dewPoint: 7.7,
        margin: 8.3,
        emc: 9,
        level: 'dry',
        surfaceSource: 'probe',
        sensorId: 's1',
      },
    };
    const html = decode(renderCard(alarm({ worstMarginK: -2.7 }), 'F', false, zone));
    expect(textsOf(html, 'alarm-headline')).toEqual(['Machine room: wet']);
    expect(textsOf(html, 'alarm-now')).toEqual(['Now margin +14.9 °F, dry · worst margin -4.9 °F']);
    expect(textsOf(html, 'alarm-rule')[0]).toMatch(
      /^Clears when the dew margin stays above 2\.7 °F for 3 readings or 5 min, whichever comes first\. Opens when the dew margin is at or below 1\.8 °F/,
    );
    expect(html).toContain('Wet · Wet surface');
    expect(html).not.toContain('°C');
  });
});

describe('the zone readings', () => {
  const latest = (dewPoint: number | null) => ({
    dewPoint,
    surface: 1,
    surfaceSource: 'probe' as const,
    air: -5,
    rh: 80,
    emc: 17.1,
    margin: null,
  });
  const labelOf = (dewPoint: number | null) =>
    textsOf(
      renderToStaticMarkup(
        createElement(ZoneReadings, { latest: latest(dewPoint), unit: 'C', humidRhPct: 90 }),
      ),
      'zone-dewpoint-label',
    );

  // Air −5 °C at 80 % RH: frost point −7.0 °C (ASHRAE Fundamentals 2017 ch. 1 eq. 5, via
  // ingest/psychrometrics.ts); the switch is the triple point, 0.01 °C.
  it.each([
    [-7.02, 'Frost point'],
    [0, 'Frost point'],
    [0.01, 'Dew point'],
    [9.27, 'Dew point'],
    [null, 'Dew point'],
  ])('%s °C is labelled %s', (dewPointC, label) => {
    expect(labelOf(dewPointC)).toEqual([label]);
  });
});
