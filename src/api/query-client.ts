import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';

import { ApiError } from './client';
import { STALE } from './stale';

function logUnexpected(error: unknown) {
  // Network and API errors are shown to the user where they happen; only surprises are logged.
  if (!(error instanceof ApiError)) console.error(error);
}

export function createQueryClient(): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({ onError: logUnexpected }),
    mutationCache: new MutationCache({ onError: logUnexpected }),
    defaultOptions: {
      queries: {
        staleTime: STALE.SECONDS.THIRTY,
        // Client errors will not fix themselves by retrying; a dropped connection might.
        retry: (failureCount, error) => error instanceof ApiError && !error.isNetwork && error.status < 500 ? false : failureCount < 2,
      },
    },
  });
}
