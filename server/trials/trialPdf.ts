/**
 * A trial on paper (pdfkit, the week report's sheet and type): the title, the treatments
 * numbered, a ranks table (tests × treatments, with rank totals and mean ranks), each test's
 * window, zone and recorded conditions in the reader's unit, the standings with a bar per
 * treatment drawn as vectors, and the Friedman result in words (ingest/words/trials.ts) with
 * its caution and, when shown, the compared pairs with their method and source. "page i of n"
 * and the making time on every page.
 */
import { formatInTimeZone } from 'date-fns-tz';

import {
  TRIAL_CONDITION_WORDS,
  TRIAL_FRIEDMAN_METHOD,
  TRIAL_KIND_WORDS,
  TRIAL_PAIRS_METHOD,
  formatP,
  trialConditionLines,
  trialPairText,
} from '@/ingest/words/trials';

import { drawFooters, startPdf } from '../reports/pdfDocument';
import { FONT_BOLD, FONT_REGULAR, pdfColors, typeSizes } from '../reports/pdfLayout';

import { madeText, type TrialExport } from './trialExport';

const ROW_PT = 14;
const NAME_COL_PT = 150;
const SECTION_GAP_PT = 14;
const BAR_HEIGHT_PT = 8;

type Doc = PDFKit.PDFDocument;

const pageBottom = (doc: Doc) => doc.page.height - doc.page.margins.bottom;

/** A new page when `height` does not fit below the cursor (unless the page is fresh). */
function keepTogether(doc: Doc, height: number): void {
  const atTop = doc.y <= doc.page.margins.top + 1;
  if (doc.y + height > pageBottom(doc) && !atTop) doc.addPage();
}

function heading(doc: Doc, text: string, width: number): void {
  keepTogether(doc, 3 * ROW_PT);
  doc.font(FONT_BOLD).fontSize(typeSizes.heading).fillColor(pdfColors.ink);
  doc.text(text, doc.page.margins.left, doc.y, { width });
  doc.moveDown(0.3);
}

function body(doc: Doc, text: string, width: number, color: string = pdfColors.ink): void {
  doc.font(FONT_REGULAR).fontSize(typeSizes.body).fillColor(color);
  doc.text(text, doc.page.margins.left, doc.y, { width });
}

/** "Mon 2 Mar 18:00" on the shop's clock. */
const clock = (at: string, tz: string) => formatInTimeZone(new Date(at), tz, 'EEE d MMM HH:mm');

/** A rank as printed: whole, or with its half for a tie. */
const rankText = (rank: number | undefined) =>
  rank === undefined ? '—' : Number.isInteger(rank) ? String(rank) : rank.toFixed(1);

function drawTitle(doc: Doc, e: TrialExport, width: number): void {
  const { trial } = e;
  const left = doc.page.margins.left;
  doc.font(FONT_BOLD).fontSize(typeSizes.title).fillColor(pdfColors.ink);
  doc.text(`Trial · ${trial.name}`, left, doc.y, { width });
  doc.moveDown(0.2);
  doc.font(FONT_REGULAR).fontSize(typeSizes.body + 1);
  const ranked = trial.standings.tests;
  doc.text(
    `${e.shop.name} · ${trial.treatments.length} treatments · ${trial.tests.length} tests, ${ranked} ranked`,
    { width },
  );
  doc.fontSize(typeSizes.body).fillColor(pdfColors.iron);
  doc.text(
    `Times on the shop's clock (${e.shop.timeZone}). Ranks: 1 = best; a tie shares the average rank. ` +
      (e.unit === 'F'
        ? 'Dew margins in °F as differences (1 K = 1.8 °F).'
        : 'Dew margins in °C as differences (1 K = 1 °C).'),
    { width },
  );
  doc.moveDown(0.8);
}

function drawTreatments(doc: Doc, e: TrialExport, width: number): void {
  heading(doc, 'Treatments', width);
  e.trial.treatments.forEach((t, i) => body(doc, `T${i + 1}  ${t.name}`, width));
  doc.moveDown(0.8);
}

/** Tests down, treatments across (T1…Tn, as numbered above), then totals and mean ranks. */
function drawRanksTable(doc: Doc, e: TrialExport, width: number): void {
  const { trial } = e;
  const left = doc.page.margins.left;
  const n = trial.treatments.length;
  const cellWidth = (width - NAME_COL_PT) / n;
  heading(doc, 'Ranks', width);

  const header = trial.treatments.map((_t, j) => `T${j + 1}`);
  const row = (label: string, cells: string[], bold: boolean, isHeader = false) => {
    if (doc.y + ROW_PT > pageBottom(doc)) {
      // A long trial runs over: the next page repeats the column heads.
      doc.addPage();
      if (!isHeader) row('Test', header, true, true);
    }
    const y = doc.y;
    doc
      .font(bold ? FONT_BOLD : FONT_REGULAR)
      .fontSize(typeSizes.body)
      .fillColor(pdfColors.ink);
    doc.text(label, left, y, { width: NAME_COL_PT - 6, height: ROW_PT, ellipsis: true });
    cells.forEach((text, j) => {
      doc.text(text, left + NAME_COL_PT + j * cellWidth, y, {
        width: cellWidth - 4,
        align: 'right',
        lineBreak: false,
      });
    });
    doc
      .save()
      .lineWidth(0.5)
      .moveTo(left, y + ROW_PT - 3)
      .lineTo(left + width, y + ROW_PT - 3)
      .stroke(pdfColors.border)
      .restore();
    doc.x = left;
    doc.y = y + ROW_PT;
  };

  row('Test', header, true, true);
  for (const test of trial.tests) {
    row(
      test.name,
      trial.treatments.map((t) => rankText(test.ranks.find((r) => r.treatmentId === t.id)?.rank)),
      false,
    );
  }
  const totalOf = (id: string) => trial.standings.rankTotals.find((r) => r.treatmentId === id);
  row(
    'Rank total',
    trial.treatments.map((t) => String(totalOf(t.id)?.total ?? '—')),
    true,
  );
  row(
    'Mean rank',
    trial.treatments.map((t) => totalOf(t.id)?.meanRank.toFixed(2) ?? '—'),
    true,
  );
  doc.moveDown(0.8);
}

function drawTests(doc: Doc, e: TrialExport, width: number): void {
  const tz = e.shop.timeZone;
  heading(doc, 'Tests and the conditions recorded', width);
  for (const test of e.trial.tests) {
    keepTogether(doc, 5 * ROW_PT);
    doc.font(FONT_BOLD).fontSize(typeSizes.body).fillColor(pdfColors.ink);
    doc.text(test.name, doc.page.margins.left, doc.y, { width });
    const zone = test.zoneId ? (e.zoneNames.get(test.zoneId) ?? 'a zone') : null;
    body(
      doc,
      `${TRIAL_KIND_WORDS[test.kind]} · ${clock(test.from, tz)} – ${clock(test.to, tz)}${zone ? ` · ${zone}` : ''}`,
      width,
      pdfColors.iron,
    );
    if (!test.zoneId) {
      body(doc, TRIAL_CONDITION_WORDS.noZone, width, pdfColors.iron);
    } else if (!test.conditions) {
      body(doc, TRIAL_CONDITION_WORDS.noReadings, width, pdfColors.iron);
    } else {
      const lines = trialConditionLines(test.conditions, e.unit);
      body(doc, lines.map(([label, value]) => `${label} ${value}`).join(' · '), width);
    }
    if (test.notes) body(doc, `Note: ${test.notes}`, width, pdfColors.iron);
    doc.moveDown(0.6);
  }
  doc.moveDown(0.4);
}

/**
 * Best first, each with its mean rank and a bar as long as the mean rank (1 … n on a common
 * scale), so the shortest bar is the best treatment.
 */
function drawStandings(doc: Doc, e: TrialExport, width: number): void {
  const { trial } = e;
  const { standings } = trial;
  heading(doc, 'Standings (lower mean rank is better)', width);
  if (standings.tests === 0) {
    body(doc, standings.verdict, width);
    doc.moveDown(0.8);
    return;
  }
  const left = doc.page.margins.left;
  const n = trial.treatments.length;
  const barLeft = left + NAME_COL_PT + 60;
  const barWidth = width - (barLeft - left);
  const rows = [...standings.rankTotals].sort((a, b) => a.meanRank - b.meanRank);
  for (const r of rows) {
    keepTogether(doc, ROW_PT);
    const y = doc.y;
    const name = trial.treatments.find((t) => t.id === r.treatmentId)?.name ?? '—';
    doc.font(FONT_REGULAR).fontSize(typeSizes.body).fillColor(pdfColors.ink);
    doc.text(name, left, y, { width: NAME_COL_PT - 6, height: ROW_PT, ellipsis: true });
    doc.text(r.meanRank.toFixed(2), left + NAME_COL_PT, y, {
      width: 50,
      align: 'right',
      lineBreak: false,
    });
    doc
      .save()
      .rect(barLeft, y + 1, Math.max(1, (barWidth * r.meanRank) / n), BAR_HEIGHT_PT)
      .fill(pdfColors.iron)
      .restore();
    doc.x = left;
    doc.y = y + ROW_PT;
  }
  doc.moveDown(0.8);
}

function drawFriedman(doc: Doc, e: TrialExport, width: number): void {
  const { standings } = e.trial;
  // With nothing ranked the standings already said so.
  if (standings.tests === 0) return;
  heading(doc, 'More than chance?', width);
  const f = standings.friedman;
  if (f) {
    const w = standings.kendallW === null ? '' : `; Kendall's W = ${standings.kendallW.toFixed(2)}`;
    body(
      doc,
      `Friedman chi-square = ${f.statistic.toFixed(2)}, df = ${f.df}, ${formatP(f.p)}${w}`,
      width,
    );
  }
  body(doc, standings.verdict, width);
  body(doc, TRIAL_FRIEDMAN_METHOD, width, pdfColors.iron);
  if (standings.pairs.length > 0) {
    doc.moveDown(0.6);
    // The pairs and their method stay on one page when they fit on one.
    keepTogether(doc, (standings.pairs.length + 5) * ROW_PT);
    heading(doc, 'Pairs', width);
    const nameOf = (id: string) => e.trial.treatments.find((t) => t.id === id)?.name ?? '—';
    for (const pair of standings.pairs) {
      body(doc, trialPairText(nameOf(pair.better), nameOf(pair.worse), pair), width);
    }
    body(doc, TRIAL_PAIRS_METHOD, width, pdfColors.iron);
  }
  doc.moveDown(SECTION_GAP_PT / typeSizes.body);
}

export async function renderTrialPdf(e: TrialExport): Promise<Buffer> {
  const { doc, width, done } = await startPdf(e.shop.paperSize, {
    Title: `Trial ${e.trial.name}`,
    Subject: `Protection trial of ${e.shop.name}`,
    CreationDate: new Date(e.generatedAt),
  });
  drawTitle(doc, e, width);
  drawTreatments(doc, e, width);
  drawRanksTable(doc, e, width);
  drawTests(doc, e, width);
  drawStandings(doc, e, width);
  drawFriedman(doc, e, width);
  drawFooters(doc, `Drybench · made ${madeText(e)}`, width);
  doc.end();
  return done;
}
