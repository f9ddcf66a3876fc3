import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';

/** The error boundary for every route: says what happened and offers a way on. */
export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Something went wrong.';
  return (
    <main className="mx-auto max-w-xl p-8">
      <h1 className="text-2xl font-semibold">This page ran into a problem</h1>
      <p className="mt-3">
        Nothing you saved is lost. <span className="text-graphite-soft">({message})</span>
      </p>
      <div className="mt-6 flex gap-4">
        <button type="button" className="underline" onClick={() => window.location.reload()}>
          Reload the page
        </button>
        <Link to="/" className="underline">
          Go to the start page
        </Link>
      </div>
    </main>
  );
}
