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

export const VERIFICATION_SUBJECT = 'Confirm your e-mail address for Drybench';

export function verificationMail(input: {
  to: string;
  verifyUrl: string;
  validHours: number;
}): MailMessage {
  const text = [
    'Welcome to Drybench. Confirm that this is your address:',
    '',
    `Confirm and sign in: ${input.verifyUrl}`,
    '',
    'Alarm and report e-mails are sent only to confirmed addresses.',
    `The link works once and for ${input.validHours} hours. If you did not create an account,`,
    'ignore this message: nothing is sent to this address without it.',
    '',
    '— Drybench',
  ].join('\n');
  const html = page(
    [
      'Welcome to Drybench. Confirm that this is your address.',
      'Alarm and report e-mails are sent only to confirmed addresses.',
    ],
    { href: input.verifyUrl, label: 'Confirm and sign in' },
    [
      `The link works once and for ${input.validHours} hours. If you did not create an account, ignore this message: nothing is sent to this address without it.`,
    ],
  );
  return { to: input.to, subject: VERIFICATION_SUBJECT, text, html };
}

/**
 * To the owner of an address someone tried to sign up with: the sign-up page answered as for a
 * new address (it must not reveal who has an account), so the owner hears it here.
 */
export function signUpAttemptMail(input: {
  to: string;
  signInUrl: string;
  resetUrl: string;
}): MailMessage {
  const text = [
    'Someone tried to create a Drybench account with this address, which already has one.',
    '',
    'If it was you, sign in or reset your password:',
    `Sign in: ${input.signInUrl}`,
    `Reset your password: ${input.resetUrl}`,
    '',
    'If it was not you, ignore this message: your account and password are unchanged.',
    '',
    '— Drybench',
  ].join('\n');
  const html = page(
    [
      'Someone tried to create a Drybench account with this address, which already has one.',
      'If it was you, sign in or reset your password.',
    ],
    { href: input.signInUrl, label: 'Sign in' },
    [
      `Forgot the password? <a href="${escapeHtml(input.resetUrl)}">Reset your password</a>.`,
      'If it was not you, ignore this message: your account and password are unchanged.',
    ],
  );
  return {
    to: input.to,
    subject: 'Someone tried to create a Drybench account with your address',
    text,
    html,
  };
}
