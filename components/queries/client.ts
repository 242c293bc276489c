import { QueryClient } from '@tanstack/react-query';

import { NETWORK_ERROR_STATUS, isApiError } from './api';

/**
 * Retry only what may heal by itself: no answer at all, or a 5xx. A 4xx (signed out, not
 * found, forbidden) will answer the same way again.
 */
export function shouldRetry(failureCount: number, error: unknown): boolean {
  if (failureCount >= 3) return false;
  if (!isApiError(error)) return true;
  return error.status === NETWORK_ERROR_STATUS || error.status >= 500;
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: { retry: shouldRetry, refetchOnWindowFocus: true },
      mutations: { retry: false },
    },
  });
}
