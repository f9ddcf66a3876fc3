import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { authKeys } from '@/features/auth/api/keys';
import { ApiError } from './api-client';

/**
 * The shop started requiring an authenticator for this person's role: read the session again, so
 * the layout sends them to their account page to set one up.
 */
const followEnrolment = (err: unknown) => {
  if (err instanceof ApiError && err.body.code === 'second-factor-enrolment')
    void queryClient.invalidateQueries({ queryKey: authKeys.session });
};

/** When the navigation under way began (the router marks each one; the first is the page's load). */
let navigationStartedAt = Date.now();
export const markNavigation = () => {
  navigationStartedAt = Date.now();
};

/** The one query cache; route loaders warm it so data and code load side by side. */
export const queryClient: QueryClient = new QueryClient({
  queryCache: new QueryCache({ onError: followEnrolment }),
  mutationCache: new MutationCache({ onError: followEnrolment }),
  defaultOptions: {
    queries: {
      // Don't hammer the server with retries for answers that won't change.
      retry: (count, err) => !(err instanceof ApiError && err.status >= 400 && err.status < 500) && count < 2,
      refetchOnWindowFocus: false,
      // The route's loader asked for the page's data as the navigation began: the page mounting a
      // moment later takes that answer instead of asking again. Older or invalidated data is
      // checked as usual.
      refetchOnMount: (query) => query.state.isInvalidated || query.state.dataUpdatedAt < navigationStartedAt,
    },
  },
});
