/** Input fields several routers share, so a rule (e.g. password length) has one home. */
import { z } from 'zod';

export const emailField = z
  .string()
  .trim()
  .toLowerCase()
  .email('Enter a valid e-mail address')
  .max(254);

// 10 characters: NIST SP 800-63B asks for at least 8; we ask a little more.
export const newPasswordField = z.string().min(10, 'Use at least 10 characters').max(200);

export const personNameField = z.string().trim().min(1, 'Enter your name').max(100);

export const roleField = z.enum(['owner', 'member', 'viewer'], 'Pick owner, member or viewer');

export const unitPrefField = z.enum(['C', 'F'], 'Pick C or F');
