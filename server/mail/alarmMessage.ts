/**
 * The alarm e-mail, plain text and HTML with the same content: what happened, the numbers in the
 * reader's unit at a time in the shop's zone, what to do now, the safety cautions that go with
 * it, a link to the Alarms page, and how to turn these mails off. The words are ingest/words',
 * the same the app's alarm cards show; only the times are written here, in the shop's zone.
 */
import { formatInTimeZone } from 'date-fns-tz';

import type { AlarmKind, Role } from '@/db/schema';
import type { TemperatureUnit } from '@/ingest/units';
import {
  ALARM_ADVICE,
  alarmHeadline,
  alarmNumbers,
  alarmRule,
  alarmStory,
  type AlarmFacts,
  type ReadingFacts,
  type RuleLimits,
} from '@/ingest/words';

import {
  bulletList,
  escapeHtml,
  linkButton,
  mailPage,
  paragraph,
  safetyBlock,
  valueTable,
} from './html';
import type { MailMessage } from './mailer';

/** The alarm's values when the mail is written (margins K, temperatures °C). */
export interface MailedAlarm extends Omit<AlarmFacts, 'cleared'> {
  kind: AlarmKind;
  sinceAt: Date;
  openedAt: Date;
}

/** The reading behind the alarm: the one that last changed it, or a silent sensor's last. */
export interface MailedReading extends ReadingFacts {
  at: Date;
}

export interface AlarmMessageInput {
  to: string;
  role: Role;
  unit: TemperatureUnit;
  shopName: string;
  timeZone: string;
  alarm: MailedAlarm;
  /** The zone's limits: the rule's numbers (when the alarm opens and clears). */
  limits: RuleLimits;
  reading: MailedReading | null;
  alarmsUrl: string;
  profileUrl: string;
}

/** "06:12" in the shop's zone. */
const clockIn = (at: Date, timeZone: string) => formatInTimeZone(at, timeZone, 'HH:mm');

/** "06:12 on Tue 3 Mar (America/Chicago)": a mail may be read a day later. */
const shopTime = (at: Date, timeZone: string) =>
  `${formatInTimeZone(at, timeZone, "HH:mm 'on' EEE d MMM")} (${timeZone})`;

export function alarmMessage(input: AlarmMessageInput): MailMessage {
  const { alarm, reading, unit, timeZone } = input;
  // Only open alarms are mailed (a cleared one's job stops before it gets here).
  const facts: AlarmFacts = { ...alarm, cleared: false };
  const context = {
    unit,
    since: clockIn(alarm.sinceAt, timeZone),
    sinceWithDate: shopTime(alarm.sinceAt, timeZone),
    dewPointC: reading?.dewPointC ?? null,
  };
  const headline = alarmHeadline(facts, context);
  const story = alarmStory(facts, context);
  const numbers = alarmNumbers(facts, reading, unit);
  const measuredAt = reading
    ? `Measured at ${shopTime(reading.at, timeZone)}:`
    : 'No reading to show.';
  const { steps, cautions } = ALARM_ADVICE[alarm.kind];
  const rule = alarmRule(alarm.kind, input.limits, unit);
  const ruleTitle = 'When it opens and clears:';
  const why = `You get this as ${input.role === 'owner' ? 'an owner' : 'a member'} of ${input.shopName} with alarm e-mails on.`;
  const off = 'To stop alarm e-mails, turn them off under Profile:';
  const width = Math.max(0, ...numbers.map(([label]) => label.length)) + 2;

  const text = [
    `${input.shopName}: ${headline}`,
    '',
    story,
    '',
    measuredAt,
    ...numbers.map(([label, value]) => `  ${label.padEnd(width)}${value}`),
    '',
    ruleTitle,
    `- ${rule.opens}`,
    `- ${rule.clears}`,
    '',
    'What to do now:',
    ...steps.map((step) => `- ${step}`),
    '',
    'Safety:',
    ...cautions.map((caution) => `- ${caution}`),
    '',
    `See the alarm and acknowledge it: ${input.alarmsUrl}`,
    '',
    `${why} ${off} ${input.profileUrl}`,
    '',
    '— Drybench',
  ].join('\n');

  const html = mailPage([
    paragraph(`<strong>${escapeHtml(input.shopName)}: ${escapeHtml(headline)}</strong>`),
    paragraph(escapeHtml(story)),
    paragraph(escapeHtml(measuredAt)),
    numbers.length > 0 ? valueTable(numbers) : '',
    paragraph(ruleTitle),
    bulletList([rule.opens, rule.clears]),
    paragraph('What to do now:'),
    bulletList(steps),
    safetyBlock(cautions),
    linkButton({ href: input.alarmsUrl, label: 'Open the Alarms page' }),
    paragraph(
      `${escapeHtml(why)} ${escapeHtml(off)} <a href="${escapeHtml(input.profileUrl)}" style="color:#2C6E91">${escapeHtml(input.profileUrl)}</a>`,
    ),
  ]);

  return { to: input.to, subject: `${headline} — ${input.shopName}`, text, html };
}
