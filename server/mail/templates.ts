/**
 * The e-mails Drybench sends, each as plain text and HTML. Every value that came from a person
 * (shop and account names) is escaped in the HTML part. Mail is signed by Drybench, never by a
 * person's name.
 */
import type { Role } from '@/db/schema';

import { escapeHtml, linkButton, mailPage, paragraph } from './html';
import type { MailMessage } from './mailer';

const ROLE_WORDS: Record<Role, string> = {
  owner: 'an owner (everything, including members, sensors and limits)',
  member: 'a member (acknowledge alarms, log care, run trials)',
  viewer: 'a viewer (read only)',
};

function page(paragraphs: string[], link: { href: string; label: string }, after: string[]) {
  return mailPage([...paragraphs.map(paragraph), linkButton(link), ...after.map(paragraph)]);
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
