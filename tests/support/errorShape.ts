import { expect } from 'vitest';

/** The shared error shape of every API error (see the HTTP contract). */
export const errorShape = {
  error: {
    code: expect.stringMatching(/^[a-z_]+$/),
    message: expect.any(String),
    details: expect.any(Array),
  },
};
