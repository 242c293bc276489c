/** Input fields several routers share, so a rule (e.g. password length) has one home. */
import { z } from 'zod';

import { ROLES, UNIT_PREFS } from '@/ingest/wire';

export const emailField = z
  .string()
  .trim()
  .toLowerCase()
  .email('Enter a valid e-mail address')
  .max(254);

// 10 characters: NIST SP 800-63B asks for at least 8; we ask a little more.
export const newPasswordField = z.string().min(10, 'Use at least 10 characters').max(200);

/**
 * C0, DEL and C1 controls, and the bidirectional marks, embeddings, overrides and isolates
 * (U+200E/F, U+202A–E, U+2066–9, U+061C): a name shows in lists, e-mail subjects and alarm
 * texts, where such characters can hide or reorder what a reader sees (an override makes
 * "Saw" plus reversed text read as another name) or break a line.
 */
const HIDDEN_CHARACTERS =
  // eslint-disable-next-line no-control-regex -- finding control characters is the point
  /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/u;

export const NAME_CHARACTERS_MESSAGE = 'Names cannot contain control or text-direction characters.';

/** A display name of a person, shop, zone or sensor: trimmed, 1–100 visible characters. */
export function nameField(emptyMessage: string) {
  return z
    .string()
    .trim()
    .min(1, emptyMessage)
    .max(100)
    .refine((name) => !HIDDEN_CHARACTERS.test(name), NAME_CHARACTERS_MESSAGE);
}

export const personNameField = nameField('Enter your name');

export const roleField = z.enum(ROLES, 'Pick owner, member or viewer');

export const unitPrefField = z.enum(UNIT_PREFS, 'Pick C or F');
