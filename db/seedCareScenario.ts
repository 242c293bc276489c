/**
 * The demo shop's care of its iron, as data: the surfaces in its zones, what Ines and Theo did
 * to them over the last weeks, and one finished protection trial. Invented, like the shop.
 * Times are days back from the seed's run at a shop-local clock time, so the simulator's
 * two-week backfill (which runs after the seed) lands inside them and gives them exposure.
 */
import type { CoatingType, RustingGrade } from '@/ingest/wire/surfaces';
import type { TrialTestKind } from '@/ingest/wire/trials';

import type { DEMO_PEOPLE, DEMO_SENSORS } from './seed';

type DemoZone = (typeof DEMO_SENSORS)[number]['zone'];
type DemoPerson = (typeof DEMO_PEOPLE)[number]['email'];

/** A shop-local time some days before the seed's run: `daysAgo` whole days, at `hh:mm`. */
export interface DemoWhen {
  daysAgo: number;
  hh: number;
  mm?: number;
}

export interface DemoCareEntry {
  kind: 'coating' | 'inspection';
  when: DemoWhen;
  by: DemoPerson;
  coating?: { type: CoatingType; product: string };
  rusting?: RustingGrade;
  note?: string;
  /** Draw a photo of the surface at this inspection (its rust as the grade says): a ground top or bars. */
  photo?: 'top' | 'bars';
}

export interface DemoSurface {
  name: string;
  zone: DemoZone;
  material: string;
  /** The demo sensor whose probe sits on this surface; absent: the zone's readings. */
  probe?: (typeof DEMO_SENSORS)[number]['name'];
  care: DemoCareEntry[];
}

const INES = 'ines@tamarack.example';
const THEO = 'theo@tamarack.example';

/**
 * The lumber rack has no iron to look after. In the demo's weather the machine room's iron
 * sweats about 2 h each morning and the finishing room's about 3 h (server/demo/dayModel.ts),
 * so the saw top's wax (budget 4 h wet, ingest/care.ts) and the clamp rack's coat are due for
 * renewal once the backfill is in, while the recent coats are still within their budgets.
 */
export const DEMO_SURFACES: readonly DemoSurface[] = [
  {
    name: 'Table saw top',
    zone: 'Machine room',
    material: 'Cast iron, ground',
    probe: 'Saw-top probe',
    care: [
      {
        kind: 'coating',
        when: { daysAgo: 24, hh: 17, mm: 30 },
        by: THEO,
        coating: { type: 'wax', product: 'Paste wax, no silicone' },
        note: 'Two thin coats, buffed after 15 minutes.',
      },
      {
        kind: 'inspection',
        when: { daysAgo: 10, hh: 8, mm: 10 },
        by: INES,
        rusting: 2,
        note: 'Specks along both mitre slots after the wet mornings. Rubbed out with a fine abrasive pad and wiped down.',
        photo: 'top',
      },
      {
        kind: 'coating',
        when: { daysAgo: 9, hh: 17, mm: 45 },
        by: THEO,
        coating: { type: 'wax', product: 'Paste wax, no silicone' },
        note: 'Re-waxed after the clean-up; two coats.',
      },
      {
        kind: 'inspection',
        when: { daysAgo: 2, hh: 9, mm: 0 },
        by: INES,
        rusting: 1,
        note: 'A few pinpoints at the outfeed end. The wax is wearing thin where boards slide.',
        photo: 'top',
      },
    ],
  },
  {
    name: 'Jointer beds',
    zone: 'Machine room',
    material: 'Cast iron, ground',
    care: [
      {
        kind: 'coating',
        when: { daysAgo: 16, hh: 16, mm: 0 },
        by: INES,
        coating: { type: 'wax', product: 'Paste wax, no silicone' },
      },
      {
        kind: 'coating',
        when: { daysAgo: 2, hh: 17, mm: 15 },
        by: INES,
        coating: {
          type: 'dry_film',
          product: 'Dry-film lubricant, PTFE in a quick-drying carrier',
        },
        note: 'Sprayed outdoors, wiped level once dry. Trying it on the jointer before the saw.',
      },
    ],
  },
  {
    name: 'Band saw table',
    zone: 'Machine room',
    material: 'Cast iron',
    care: [
      {
        kind: 'coating',
        when: { daysAgo: 3, hh: 16, mm: 40 },
        by: THEO,
        coating: { type: 'inhibitor_spray', product: 'Corrosion-inhibitor spray, waxy film' },
      },
      {
        kind: 'inspection',
        when: { daysAgo: 1, hh: 8, mm: 30 },
        by: THEO,
        rusting: 0,
        note: 'Clean. Water beads on the film.',
      },
    ],
  },
  {
    name: 'Hand-plane shelf',
    zone: 'Machine room',
    material: 'Cast-iron plane soles, carbon-steel irons',
    care: [
      {
        kind: 'coating',
        when: { daysAgo: 1, hh: 18, mm: 0 },
        by: INES,
        coating: { type: 'oil', product: 'Light machine oil on a rag' },
        note: 'Soles and irons wiped thin. The rag went to the metal can outside.',
      },
    ],
  },
  {
    name: 'Clamp rack',
    zone: 'Finishing room',
    material: 'Steel bar clamps',
    care: [
      {
        kind: 'coating',
        when: { daysAgo: 6, hh: 17, mm: 0 },
        by: THEO,
        coating: { type: 'other', product: 'Shop-made paste of beeswax and mineral oil' },
      },
      {
        kind: 'inspection',
        when: { daysAgo: 1, hh: 9, mm: 15 },
        by: THEO,
        rusting: 3,
        note: 'Spots on the bars where glue squeeze-out sat overnight, worst near the spray bench.',
        photo: 'bars',
      },
    ],
  },
];

export interface DemoTrialTest {
  name: string;
  kind: TrialTestKind;
  zone: DemoZone;
  from: DemoWhen;
  to: DemoWhen;
  /**
   * The share of each coupon's face that rusted (%), in treatment order: what Theo judged the
   * ranks from (less rust ranks better; equal shares tie) and what the test's photo shows.
   */
  rustedPct: readonly [number, number, number, number];
  notes: string;
}

/** Four coupons cut from one cast-iron plate, ground alike, one treatment each. */
export const DEMO_TRIAL = {
  name: 'Coupon trial: four protections',
  by: THEO,
  treatments: ['Paste wax', 'Dry-film lubricant', 'Inhibitor spray', 'Bare iron (control)'],
  tests: [
    {
      name: 'Morning sweat, first week',
      kind: 'condensation',
      zone: 'Machine room',
      from: { daysAgo: 13, hh: 17 },
      to: { daysAgo: 11, hh: 12 },
      rustedPct: [2, 6, 0.5, 35],
      notes: 'Coupons flat on the saw wing through two cold nights and warm mornings.',
    },
    {
      name: 'Water ring overnight',
      kind: 'standing_liquid',
      zone: 'Machine room',
      from: { daysAgo: 11, hh: 18 },
      to: { daysAgo: 10, hh: 8 },
      rustedPct: [1, 4, 3, 20],
      notes: 'A damp glass stood on each coupon for 14 hours.',
    },
    {
      name: 'Board sliding, 200 passes',
      kind: 'wear',
      zone: 'Machine room',
      from: { daysAgo: 10, hh: 9 },
      to: { daysAgo: 10, hh: 16 },
      rustedPct: [3, 0.5, 8, 25],
      notes: 'A pine board slid 200 times over each coupon, then a wet rag wiped across.',
    },
    {
      name: 'Closed box over a damp sponge',
      kind: 'humid_storage',
      zone: 'Finishing room',
      from: { daysAgo: 9, hh: 17 },
      to: { daysAgo: 6, hh: 17 },
      rustedPct: [1.5, 5, 0.3, 30],
      notes: 'Three days in a lidded plastic box with a damp sponge in a dish.',
    },
    {
      name: 'Morning sweat, second week',
      kind: 'condensation',
      zone: 'Machine room',
      from: { daysAgo: 6, hh: 17 },
      to: { daysAgo: 4, hh: 12 },
      rustedPct: [1, 6, 1, 40],
      notes: 'As the first week. Wax and inhibitor looked the same: ranked as a tie.',
    },
    {
      name: 'Hand prints left overnight',
      kind: 'other',
      zone: 'Machine room',
      from: { daysAgo: 3, hh: 18 },
      to: { daysAgo: 2, hh: 8 },
      rustedPct: [2, 3, 0.5, 15],
      notes: 'A palm pressed on each coupon after planing, left until morning.',
    },
  ] satisfies DemoTrialTest[],
} as const;
