import { QueryClient, type DefaultOptions } from '@tanstack/react-query';
import { ApiError } from './api-client';

export const queryConfig = {
  queries: {
    // A 4xx will not change on retry (no access, not found, bad input); network blips and 5xx might.
    retry: (failureCount, error) =>
      !(error instanceof ApiError && error.status >= 400 && error.status < 500) && failureCount < 2,
    refetchOnWindowFocus: false,
    staleTime: 30_000,
  },
  mutations: { retry: false },
} satisfies DefaultOptions;

export function createQueryClient(): QueryClient {
  return new QueryClient({ defaultOptions: queryConfig });
}
