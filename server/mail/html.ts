/**
 * The HTML part of Drybench's e-mails: one card on the paper colour of LOOK.md, inline styles
 * only (mail clients drop style sheets). Every value that came from a person or a sensor name
 * goes through escapeHtml before it is placed.
 */
export function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

const TEXT = 'font:15px/1.5 monospace;color:#1F2427';

/** A paragraph of HTML that is already escaped. */
export function paragraph(html: string): string {
  return `<p style="margin:0 0 16px;${TEXT}">${html}</p>`;
}

/** A list of plain-text items. */
export function bulletList(items: readonly string[]): string {
  const li = items.map((item) => `<li style="margin:0 0 6px">${escapeHtml(item)}</li>`);
  return `<ul style="margin:0 0 16px;padding-left:20px;${TEXT}">${li.join('')}</ul>`;
}

/** A list whose items are HTML already escaped (a bold lead and a sentence after it). */
export function htmlList(itemsHtml: readonly string[]): string {
  const li = itemsHtml.map((item) => `<li style="margin:0 0 10px">${item}</li>`);
  return `<ul style="margin:0 0 16px;padding-left:20px;${TEXT}">${li.join('')}</ul>`;
}

/**
 * Cautions in a box of their own under a "Safety" heading: set apart by a border and by the word,
 * not by colour alone (some clients drop colours, some readers cannot tell them apart).
 */
export function safetyBlock(cautions: readonly string[]): string {
  if (cautions.length === 0) return '';
  const li = cautions.map((item) => `<li style="margin:0 0 6px">${escapeHtml(item)}</li>`);
  return [
    '<div style="margin:0 0 16px;padding:12px 14px;border:1px solid #56626B;border-left-width:4px;border-radius:6px">',
    `<p style="margin:0 0 8px;${TEXT};font-weight:bold">Safety</p>`,
    `<ul style="margin:0;padding-left:20px;${TEXT}">${li.join('')}</ul>`,
    '</div>',
  ].join('');
}

/** Label–value rows of plain text, values in tabular figures. */
export function valueTable(rows: readonly (readonly [string, string])[]): string {
  const tr = rows.map(
    ([label, value]) =>
      `<tr><td style="padding:2px 16px 2px 0;color:#56626B">${escapeHtml(label)}</td>` +
      `<td style="padding:2px 0;font-variant-numeric:tabular-nums">${escapeHtml(value)}</td></tr>`,
  );
  return `<table role="presentation" style="margin:0 0 16px;border-collapse:collapse;${TEXT}">${tr.join('')}</table>`;
}

/** The call to action, with the address spelled out for clients that hide buttons. */
export function linkButton(link: { href: string; label: string }): string {
  return [
    `<p style="margin:0 0 16px"><a href="${escapeHtml(link.href)}" style="display:inline-block;padding:12px 18px;background:#1F2427;color:#FFFDF8;border-radius:6px;font:15px monospace;text-decoration:none">${escapeHtml(link.label)}</a></p>`,
    paragraph(`Or paste this address into your browser:<br>${escapeHtml(link.href)}`),
  ].join('');
}

/** The card around the blocks, signed by Drybench (never by a person's name). */
export function mailPage(blocks: readonly string[]): string {
  return [
    '<!doctype html><html><body style="margin:0;padding:24px;background:#F5F2EA">',
    '<div style="max-width:520px;margin:0 auto;padding:24px;background:#FFFDF8;border:1px solid #E2DCCF;border-radius:10px">',
    ...blocks,
    '<p style="margin:0;font:12px/1.5 monospace;color:#56626B">— Drybench</p>',
    '</div></body></html>',
  ].join('');
}
