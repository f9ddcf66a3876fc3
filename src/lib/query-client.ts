import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/** The one query cache; route loaders warm it so data and code load side by side. */
export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      // Don't hammer the server with retries for answers that won't change.
      retry: (count, err) => !(err instanceof ApiError && err.status >= 400 && err.status < 500) && count < 2,
      refetchOnWindowFocus: false,
    },
  },
});
