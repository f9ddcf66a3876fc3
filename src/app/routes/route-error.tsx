import { useQueryClient } from '@tanstack/react-query';
import { Link, useLocation, useNavigate, useRouteError } from 'react-router-dom';
import { Problem } from '@/components/errors/problem';
import { paths } from '@/config/paths';
import { ApiError } from '@/lib/api-client';

/** Where a page's error offers to go back to, when there is a list above it. */
export interface WayBack {
  to: string;
  label: string;
}

/**
 * The error boundary of every route: a page whose data or code failed says what happened, inside
 * the app's frame (navigation stays), with a retry and a way back — never a blank page.
 */
export function RouteError({ back }: { back?: WayBack }) {
  const error = useRouteError();
  const location = useLocation();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  // An answer from the server: failed queries start over and the same address is visited again (a
  // new location resets the boundary). Anything else (the page's code did not load): reload.
  const retry = async () => {
    if (!(error instanceof ApiError)) return window.location.reload();
    await queryClient.resetQueries({ predicate: (q) => q.state.status === 'error' });
    await navigate(location, { replace: true });
  };
  return (
    <div className="mx-auto max-w-2xl px-4 py-8">
      <Problem error={error} onRetry={() => void retry()}>
        {back && (
          <Link to={back.to} className="font-semibold underline">
            {back.label}
          </Link>
        )}
        <Link to={paths.home.href()} className="underline">
          Start page
        </Link>
      </Problem>
    </div>
  );
}
