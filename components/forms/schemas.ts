/**
 * Client-side checks of the people forms, mirroring the server's (server/routes/fields.ts),
 * so a person sees a mistake next to the field before anything is sent. `zod/mini` keeps
 * the web bundle small (metro.config.js also leaves zod's other locales out); the server
 * checks everything again.
 */
import * as z from 'zod/mini';

import { checkTimeZone } from '@/ingest/timeZones';
import { ROLES } from '@/ingest/wire/people';

export const emailSchema = z
  .string()
  .check(
    z.trim(),
    z.minLength(1, 'Enter your e-mail address'),
    z.email('Enter a valid e-mail address'),
  );

// 10 characters, like the server: NIST SP 800-63B asks for at least 8.
export const newPasswordSchema = z
  .string()
  .check(z.minLength(10, 'Use at least 10 characters'), z.maxLength(200, 'At most 200 characters'));

export const nameSchema = z
  .string()
  .check(z.trim(), z.minLength(1, 'Enter a name'), z.maxLength(100, 'At most 100 characters'));

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().check(z.minLength(1, 'Enter your password')),
});

export const signUpSchema = z.object({
  name: nameSchema,
  email: emailSchema,
  password: newPasswordSchema,
});

export const resetRequestSchema = z.object({ email: emailSchema });

export const newPasswordFormSchema = z
  .object({ password: newPasswordSchema, repeat: z.string() })
  .check(
    z.refine((v) => v.password === v.repeat, {
      message: 'The two passwords differ',
      path: ['repeat'],
    }),
  );

export const acceptNewAccountSchema = z.object({ name: nameSchema, password: newPasswordSchema });

export const shopSchema = z.object({
  name: nameSchema,
  timeZone: z.string().check(
    z.trim(),
    z.minLength(1, 'Pick a time zone from the list'),
    z.refine((name) => checkTimeZone(name).ok, 'Pick a time zone from the list'),
  ),
});

export const inviteSchema = z.object({
  email: emailSchema,
  role: z.enum(ROLES),
});

export const sensorSchema = z.object({
  name: nameSchema,
  zoneId: z.string().check(z.minLength(1, 'Pick a zone')),
});

export const zoneNameSchema = z.object({ name: nameSchema });

export const passwordChangeSchema = z.object({
  currentPassword: z.string().check(z.minLength(1, 'Enter your current password')),
  newPassword: newPasswordSchema,
});

/** A decimal typed by a person ("2,5" or "2.5"); the message names the field's unit. */
export const decimalText = (what: string) =>
  z
    .string()
    .check(
      z.refine(
        (s) => s.trim() !== '' && Number.isFinite(Number(s.replace(',', '.'))),
        `Enter ${what}`,
      ),
    );

export const zoneLimitsSchema = z.object({
  name: nameSchema,
  caution: decimalText('a number'),
  wet: decimalText('a number'),
  humid: decimalText('a percentage'),
});

export function parseDecimal(text: string): number {
  return Number(text.replace(',', '.'));
}
