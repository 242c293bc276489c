/**
 * What to do about an alarm, and the cautions that go with it: the same steps and the same
 * cautions on the app's alarm cards and in the alarm e-mails. Our own words, written for people
 * who run a shop; they point to the makers' instructions, the product's label and safety data
 * sheet, local electrical and fire codes and licensed electricians rather than replace them.
 *
 * The rule the tests hold every kind to: advice that has a person wipe or coat the iron carries
 * the unplug, label, ventilation and oily-rag cautions; advice that warms the iron or dries the
 * air carries the fuel-heater (carbon monoxide) caution.
 */
import type { AlarmKind } from '../alarmKinds';

export const CAUTIONS = {
  unplug: 'Switch off and unplug the machine before wiping near a blade or cutterhead.',
  coatingLabel: 'Apply coatings as their label and safety data sheet say.',
  ventilate:
    'Ventilate when spraying: aerosols are flammable, so no flames or running heaters nearby.',
  oilyRags:
    'Oily rags can self-heat and catch fire: dispose of them as the label says, or lay them flat to dry, or keep them in a closed metal container with water.',
  fuelHeaters:
    'Unvented fuel-burning heaters (propane, kerosene) add moisture and carbon monoxide to the air: do not dry the shop with one, and never run a heater near finishing vapours or dust.',
  appliancesAndCodes:
    'Use heaters and dehumidifiers as their makers instruct, and follow local electrical and fire codes; new circuits or wiring are work for a licensed electrician.',
  sensorPower:
    'Use the batteries or power supply the sensor’s maker names, as its instructions say, and follow local electrical codes for any mains wiring.',
} as const;

export interface AlarmAdvice {
  /** What to do, in order, one short sentence each. */
  steps: readonly string[];
  /** The cautions that go with those steps, shown as a separate "Safety" block. */
  cautions: readonly string[];
}

/** Drying the air or warming the iron: a heater or a dehumidifier is about to be switched on. */
const DRYING_CAUTIONS = [CAUTIONS.fuelHeaters, CAUTIONS.appliancesAndCodes];

export const ALARM_ADVICE: Record<AlarmKind, AlarmAdvice> = {
  dew_risk: {
    steps: [
      'Warm the shop slowly, a few degrees an hour, so the iron keeps up with the air.',
      'Dry the air: run a dehumidifier and close doors and windows against damp outside air.',
      'Cover the machine tops so the damp air stays off the iron.',
    ],
    cautions: DRYING_CAUTIONS,
  },
  wet_surface: {
    steps: [
      'Wipe the water off the iron and dry it with a clean cloth.',
      'Warm the shop slowly or run a dehumidifier until the margin recovers.',
      'Once the iron is dry, re-apply its protective coating (wax, dry lubricant or rust inhibitor).',
    ],
    cautions: [
      CAUTIONS.unplug,
      CAUTIONS.coatingLabel,
      CAUTIONS.ventilate,
      CAUTIONS.oilyRags,
      ...DRYING_CAUTIONS,
    ],
  },
  humid_air: {
    steps: [
      'Close doors and windows against damp outside air.',
      'Run a dehumidifier; gentle heat lowers the relative humidity too.',
      'Keep the machine tops covered while the air stays damp.',
    ],
    cautions: DRYING_CAUTIONS,
  },
  sensor_silent: {
    steps: [
      'Check the sensor’s power: batteries, or the plug and its outlet.',
      'Check its network: Wi-Fi reach, the router, and that its token was not revoked (Sensors page).',
      'Until it posts again, look at the machines yourself: a silent sensor looks like a dry shop.',
    ],
    cautions: [CAUTIONS.sensorPower],
  },
  battery_low: {
    steps: ['Fit fresh batteries before the sensor goes silent.'],
    cautions: [CAUTIONS.sensorPower],
  },
};
