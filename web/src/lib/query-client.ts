import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api';

/** The one QueryClient. Client errors (4xx) are not retried: they will not change by themselves. */
export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 15_000,
      retry: (failureCount, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && failureCount < 2,
      refetchOnWindowFocus: false,
    },
  },
});
