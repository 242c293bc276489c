/**
 * The e-mails Drybench sends, each as plain text and HTML. Every value that came from a person
 * (shop and account names) is escaped in the HTML part. Mail is signed by Drybench, never by a
 * person's name.
 */
import type { Role } from '@/db/schema';

import type { MailMessage } from './mailer';

const ROLE_WORDS: Record<Role, string> = {
  owner: 'an owner (everything, including members, sensors and limits)',
  member: 'a member (acknowledge alarms, log care, run trials)',
  viewer: 'a viewer (read only)',
};

function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

function page(paragraphs: string[], link: { href: string; label: string }, after: string[]) {
  const p = (html: string) =>
    `<p style="margin:0 0 16px;font:15px/1.5 monospace;color:#1F2427">${html}</p>`;
  return [
    '<!doctype html><html><body style="margin:0;padding:24px;background:#F5F2EA">',
    '<div style="max-width:520px;margin:0 auto;padding:24px;background:#FFFDF8;border:1px solid #E2DCCF;border-radius:10px">',
    ...paragraphs.map(p),
    `<p style="margin:0 0 16px"><a href="${escapeHtml(link.href)}" style="display:inline-block;padding:12px 18px;background:#1F2427;color:#FFFDF8;border-radius:6px;font:15px monospace;text-decoration:none">${escapeHtml(link.label)}</a></p>`,
    p(`Or paste this address into your browser:<br>${escapeHtml(link.href)}`),
    ...after.map(p),
    '<p style="margin:0;font:12px/1.5 monospace;color:#56626B">— Drybench</p>',
    '</div></body></html>',
  ].join('');
}

export function invitationMail(input: {
  to: string;
  shopName: string;
  inviterName: string;
  role: Role;
  acceptUrl: string;
  expiresAt: Date;
}): MailMessage {
  const expires = input.expiresAt.toUTCString();
  const text = [
    `${input.inviterName} invited you to ${input.shopName} on Drybench as ${ROLE_WORDS[input.role]}.`,
    '',
    'Drybench watches the dew margin of the shop’s machine tops and warns before the iron sweats.',
    '',
    `Accept the invitation: ${input.acceptUrl}`,
    '',
    `The link works once and expires ${expires}. If you did not expect this, ignore this message.`,
    '',
    '— Drybench',
  ].join('\n');
  const html = page(
    [
      `${escapeHtml(input.inviterName)} invited you to <strong>${escapeHtml(input.shopName)}</strong> on Drybench as ${escapeHtml(ROLE_WORDS[input.role])}.`,
      'Drybench watches the dew margin of the shop’s machine tops and warns before the iron sweats.',
    ],
    { href: input.acceptUrl, label: 'Accept the invitation' },
    [
      `The link works once and expires ${escapeHtml(expires)}. If you did not expect this, ignore this message.`,
    ],
  );
  return { to: input.to, subject: `Join ${input.shopName} on Drybench`, text, html };
}

export function passwordResetMail(input: {
  to: string;
  resetUrl: string;
  validMinutes: number;
}): MailMessage {
  const text = [
    'Someone asked to reset the password of your Drybench account.',
    '',
    `Choose a new password: ${input.resetUrl}`,
    '',
    `The link works once and for ${input.validMinutes} minutes. If it was not you, ignore this`,
    'message: your password stays as it is.',
    '',
    '— Drybench',
  ].join('\n');
  const html = page(
    ['Someone asked to reset the password of your Drybench account.'],
    { href: input.resetUrl, label: 'Choose a new password' },
    [
      `The link works once and for ${input.validMinutes} minutes. If it was not you, ignore this message: your password stays as it is.`,
    ],
  );
  return { to: input.to, subject: 'Reset your Drybench password', text, html };
}
