import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import type { ReactElement } from 'react';

/** A QueryClient that never retries, so a failure shows at once. */
export const testQueryClient = () => new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });

/** Renders inside a QueryClientProvider (a fresh never-retrying client unless one is given). */
export function renderWithClient(ui: ReactElement, queryClient = testQueryClient()) {
  return { queryClient, ...render(<QueryClientProvider client={queryClient}>{ui}</QueryClientProvider>) };
}
