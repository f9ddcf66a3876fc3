import type { ReactNode } from 'react';
import { isRouteErrorResponse } from 'react-router-dom';
import { problemsMessage } from '@shared/schemas/problems';
import { ApiError } from '@/lib/api-client';
import { problemSentence } from '@/lib/problem-sentence';

/** A failure in words a person at the bench can act on; `subject` names what failed (a page, a panel). */
export function describeError(error: unknown, subject = 'This page'): { title: string; detail: string } {
  const failed = `${subject} ran into a problem`;
  if (isRouteErrorResponse(error))
    return error.status === 404
      ? { title: 'Nothing here', detail: 'That page does not exist, or it has moved.' }
      : { title: failed, detail: `${error.status} ${error.statusText}` };
  if (error instanceof ApiError) {
    const detail = error.fields.length ? problemsMessage(error.fields.map(problemSentence)) : error.message;
    if (error.status === 0) return { title: 'Cannot reach the server', detail: error.message };
    if (error.status === 400) return { title: 'That address does not name anything', detail };
    if (error.status === 401) return { title: 'You are signed out', detail };
    if (error.status === 403) return { title: 'Not open to you', detail };
    if (error.status === 404) return { title: 'Not found', detail };
    return { title: failed, detail };
  }
  // A page's code that cannot be fetched: the app was updated, or the connection dropped.
  if (error instanceof TypeError && /dynamically imported module|module script/i.test(error.message))
    return {
      title: 'This page could not be loaded',
      detail: 'Benchwright may have been updated, or the connection dropped. Reload the page.',
    };
  return {
    title: failed,
    detail: error instanceof Error ? error.message : 'Something went wrong.',
  };
}

/** What failed, that nothing saved is lost, and the ways on (retry, back). */
export function Problem({
  error,
  subject,
  heading: Heading = 'h1',
  onRetry,
  children,
}: {
  error: unknown;
  subject?: string;
  heading?: 'h1' | 'h2';
  onRetry?: () => void;
  /** Links back, after the retry button. */
  children?: ReactNode;
}) {
  const { title, detail } = describeError(error, subject);
  return (
    <section role="alert" className="flex flex-col gap-3 rounded-md border border-out bg-out-wash px-4 py-4">
      <Heading className={Heading === 'h1' ? 'text-2xl font-semibold' : 'text-lg font-semibold'}>
        {title}
      </Heading>
      <p>{detail}</p>
      <p className="text-sm text-graphite-soft">Nothing you saved is lost.</p>
      <div className="flex flex-wrap items-center gap-4">
        {onRetry && (
          <button
            type="button"
            className="min-h-11 rounded-md border border-rule bg-card px-4 text-sm font-semibold hover:bg-paper-deep"
            onClick={onRetry}
          >
            Try again
          </button>
        )}
        {children}
      </div>
    </section>
  );
}
