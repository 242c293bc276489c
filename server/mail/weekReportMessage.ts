/**
 * The Monday week-report e-mail, plain text and HTML with the same content: the shop-wide line,
 * one short line per zone with its verdict, in the reader's unit (the report was built in it), a
 * link to the Report screen for that week, how to turn the mail off, and the PDF attached. The
 * words are ingest/words' (weekMail.ts and the report's own verdicts).
 */
import type { Role } from '@/db/schema';
import type { WeekReport } from '@/ingest/wire/reports';
import {
  WEEK_MAIL_OFF,
  weekMailIntro,
  weekMailSubject,
  weekMailWhy,
  weekReportPdfName,
  zoneWeekLine,
} from '@/ingest/words';

import { escapeHtml, htmlList, linkButton, mailPage, paragraph } from './html';
import type { MailMessage } from './mailer';

export interface WeekReportMessageInput {
  to: string;
  role: Role;
  /** Built in the reader's unit: its verdicts are written in it. */
  report: WeekReport;
  /** The PDF of the same report; null when it could not be made (the mail says where to get it). */
  pdf: Buffer | null;
  reportUrl: string;
  profileUrl: string;
}

export function weekReportMessage(input: WeekReportMessageInput): MailMessage {
  const { report } = input;
  const unit = report.unit;
  const intro = weekMailIntro(report);
  const zoneLines = report.zones.map((zone) => ({
    line: zoneWeekLine(zone, unit, report.shop.timeZone),
    verdict: zone.verdict,
  }));
  const filename = weekReportPdfName(report.week.start);
  const attached = input.pdf
    ? `The report as a PDF is attached (${filename}).`
    : 'The PDF could not be made this time; download it from the Report screen.';
  const why = weekMailWhy(input.role, report.shop.name);
  const zonesTitle = report.zones.length > 0 ? 'Zones:' : 'No zones in this shop yet.';

  const text = [
    intro,
    '',
    report.shopWide.verdict,
    ...(report.week.note ? ['', report.week.note] : []),
    '',
    zonesTitle,
    ...zoneLines.flatMap(({ line, verdict }) => [`- ${line}.`, `  ${verdict}`]),
    '',
    `The full report with charts: ${input.reportUrl}`,
    attached,
    '',
    `${why} ${WEEK_MAIL_OFF} ${input.profileUrl}`,
    '',
    '— Drybench',
  ].join('\n');

  const html = mailPage([
    paragraph(`<strong>${escapeHtml(intro)}</strong>`),
    paragraph(escapeHtml(report.shopWide.verdict)),
    report.week.note ? paragraph(escapeHtml(report.week.note)) : '',
    paragraph(zonesTitle),
    zoneLines.length > 0
      ? htmlList(
          zoneLines.map(
            (z) => `<strong>${escapeHtml(z.line)}.</strong><br>${escapeHtml(z.verdict)}`,
          ),
        )
      : '',
    linkButton({ href: input.reportUrl, label: 'Open the week report' }),
    paragraph(escapeHtml(attached)),
    paragraph(
      `${escapeHtml(why)} ${escapeHtml(WEEK_MAIL_OFF)} <a href="${escapeHtml(input.profileUrl)}" style="color:#2C6E91">${escapeHtml(input.profileUrl)}</a>`,
    ),
  ]);

  return {
    to: input.to,
    subject: weekMailSubject(report.shop.name, report.week.start),
    text,
    html,
    attachments: input.pdf
      ? [{ filename, contentType: 'application/pdf', content: input.pdf }]
      : undefined,
  };
}
