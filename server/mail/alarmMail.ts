/**
 * The alarm e-mail, plain text and HTML with the same content: what happened, the numbers in the
 * reader's unit at a time in the shop's zone, what to do now with its caution, a link to the
 * Alarms page, and how to turn these mails off.
 */
import type { Role } from '@/db/schema';
import type { TemperatureUnit } from '@/ingest/units';

import {
  alarmMailHeadline,
  alarmMailNumbers,
  alarmMailStory,
  alarmMailSteps,
  shopTime,
  type MailedAlarm,
  type MailedReading,
} from './alarmWords';
import { bulletList, escapeHtml, linkButton, mailPage, paragraph, valueTable } from './html';
import type { MailMessage } from './mailer';

export interface AlarmMailInput {
  to: string;
  role: Role;
  unit: TemperatureUnit;
  shopName: string;
  timeZone: string;
  alarm: MailedAlarm;
  reading: MailedReading | null;
  alarmsUrl: string;
  profileUrl: string;
}

export function alarmMail(input: AlarmMailInput): MailMessage {
  const { alarm, reading, unit, timeZone } = input;
  const headline = alarmMailHeadline(alarm, unit, timeZone);
  const story = alarmMailStory(alarm, unit, timeZone);
  const numbers = alarmMailNumbers(alarm, reading, unit);
  const measuredAt = reading
    ? `Measured at ${shopTime(reading.at, timeZone)}:`
    : 'No reading to show.';
  const { steps, caution } = alarmMailSteps(alarm.kind);
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
    'What to do now:',
    ...steps.map((step) => `- ${step}`),
    '',
    caution,
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
    paragraph('What to do now:'),
    bulletList(steps),
    paragraph(escapeHtml(caution)),
    linkButton({ href: input.alarmsUrl, label: 'Open the Alarms page' }),
    paragraph(
      `${escapeHtml(why)} ${escapeHtml(off)} <a href="${escapeHtml(input.profileUrl)}" style="color:#2C6E91">${escapeHtml(input.profileUrl)}</a>`,
    ),
  ]);

  return { to: input.to, subject: `${headline} — ${input.shopName}`, text, html };
}
