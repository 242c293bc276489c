/**
 * The development outbox: /dev/outbox lists what the local SMTP server received, so a person
 * trying the demo can open an invitation or reset link. Mounted only when DEV_OUTBOX=true.
 */
import { Router } from 'express';

import { escapeHtml } from './html';
import type { Outbox, StoredMail } from './outbox';

/** Escapes the plain-text part and turns its web addresses into links. */
function linkify(text: string): string {
  return escapeHtml(text).replace(/https?:\/\/[^\s<]+/g, (url) => `<a href="${url}">${url}</a>`);
}

const STYLE = `body{margin:0;padding:24px;background:#F5F2EA;color:#1F2427;font:14px/1.5 monospace}
main{max-width:760px;margin:0 auto}article{background:#FFFDF8;border:1px solid #E2DCCF;
border-radius:10px;padding:16px;margin:0 0 16px}h1{font-size:18px}h2{font-size:16px;margin:0 0 4px}
pre{white-space:pre-wrap;overflow-wrap:anywhere;margin:12px 0 0}a{color:#2C6E91}.meta{color:#56626B;font-size:12px}`;

/** "drybench-week-2026-03-23.pdf (48 kB)" links, one per attached file. */
function attachmentLinks(mail: StoredMail): string {
  return mail.attachments
    .map(
      (a, i) =>
        ` · <a href="/dev/outbox/${mail.id}/attachments/${i}">${escapeHtml(a.filename || `file ${i + 1}`)}</a> (${Math.ceil(a.content.length / 1024)} kB)`,
    )
    .join('');
}

function message(mail: StoredMail): string {
  const html =
    (mail.html ? ` · <a href="/dev/outbox/${mail.id}/html">HTML part</a>` : '') +
    attachmentLinks(mail);
  return `<article aria-label="${escapeHtml(mail.subject)}"><h2>${escapeHtml(mail.subject)}</h2>
<div class="meta">to ${escapeHtml(mail.to.join(', '))} · from ${escapeHtml(mail.from)} · ${escapeHtml(mail.receivedAt)}${html}</div>
<pre>${linkify(mail.text)}</pre></article>`;
}

export function outboxRouter(outbox: Outbox): Router {
  const router = Router();
  router.get('/dev/outbox', (_req, res) => {
    const list = outbox.list();
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width,initial-scale=1"><title>Outbox · Drybench</title>
<style>${STYLE}</style></head><body><main><h1>Outbox (development only)</h1>
<p class="meta">Mail the local SMTP server received, newest first. Nothing here leaves this machine.</p>
${list.length ? list.map(message).join('\n') : '<p>No mail yet.</p>'}</main></body></html>`);
  });
  router.get('/dev/outbox/:id/html', (req, res) => {
    const mail = outbox.get(req.params.id);
    if (!mail?.html) return res.status(404).type('text').send('No such message.');
    // The HTML part is shown as sent, in a sandbox: no scripts, no same-origin access.
    res.setHeader(
      'Content-Security-Policy',
      "sandbox allow-popups; default-src 'none'; style-src 'unsafe-inline'",
    );
    res.type('html').send(mail.html);
  });
  router.get('/dev/outbox/:id/attachments/:index', (req, res) => {
    const file = outbox.get(req.params.id)?.attachments[Number(req.params.index)];
    if (!file) return res.status(404).type('text').send('No such attachment.');
    // Downloaded, never shown inline: the file came from a mail, not from this page.
    res.attachment(file.filename || 'attachment');
    res.type(file.contentType).send(file.content);
  });
  return router;
}
