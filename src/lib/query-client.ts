import { QueryClient } from '@tanstack/react-query';
import { ApiRequestError } from './api-client';

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      // Do not retry what will not change: missing, forbidden, signed out.
      retry: (count, error) => !(error instanceof ApiRequestError && error.status >= 400 && error.status < 500) && count < 2,
    },
  },
});
