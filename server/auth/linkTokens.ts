/**
 * Tokens for links sent by e-mail (invitations, password resets): 256 random bits, shown only
 * in the link and stored as SHA-256 like sensor tokens, so a copy of the database opens nothing.
 */
import { randomBytes } from 'node:crypto';

export { hashToken } from './sensorTokens';

export function newLinkToken(): string {
  return randomBytes(32).toString('base64url');
}
