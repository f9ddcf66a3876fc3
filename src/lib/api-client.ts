/** The one fetch wrapper: JSON in and out, the CSRF token on writes, one error type. */

export interface FieldProblem {
  field: string;
  reason: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: FieldProblem[] = [],
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export interface Person {
  id: string;
  displayName: string;
}

let csrfToken = '';
/** Whose session the token belongs to, as the server said with it (null: nobody signed in). */
let tokenOwner: Person | null = null;
export const setCsrfToken = (token: string) => {
  csrfToken = token;
};
/** For requests that cannot go through `api` (multipart uploads). */
export const getCsrfToken = () => csrfToken;

type Json = Record<string, unknown> | unknown[];

export interface WriteOptions {
  /** Who made this write (a queued entry keeps its maker); by default whoever the token belonged to when it was sent. */
  madeBy?: Person | null;
}

async function request<T>(
  method: string,
  url: string,
  body?: Json,
  opts: WriteOptions & { retried?: boolean } = {},
): Promise<T> {
  const madeBy = opts.madeBy === undefined ? tokenOwner : opts.madeBy;
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken;
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers,
      body: body === undefined ? undefined : JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'Cannot reach the Benchwright server. Check the connection and try again.');
  }
  const text = await res.text();
  const data = text ? (JSON.parse(text) as Record<string, unknown>) : {};
  // The token went stale (a sign-in in another tab, or an answer to an older request arriving
  // last): fetch the session's current one and send the write once more — but only if the session
  // still belongs to the person who made the write; it is never sent in someone else's name.
  if (res.status === 403 && data.code === 'csrf' && method !== 'GET' && !opts.retried) {
    const session = await request<{ user: Person | null }>('GET', '/api/auth/session');
    if (madeBy && session.user && session.user.id !== madeBy.id) {
      const now = session.user.displayName;
      throw new ApiError(
        403,
        `Signed in as ${now}; this was done by ${madeBy.displayName} — sign in as ${madeBy.displayName} to send it.`,
        [],
        {
          code: 'session-changed',
          signedInAs: { id: session.user.id, displayName: now },
          madeBy,
        },
      );
    }
    return request<T>(method, url, body, { madeBy, retried: true });
  }
  if (!res.ok) {
    const message = typeof data.error === 'string' ? data.error : `The server answered ${res.status}.`;
    throw new ApiError(res.status, message, (data.fields as FieldProblem[]) ?? [], data);
  }
  if (typeof data.csrfToken === 'string') {
    setCsrfToken(data.csrfToken);
    const user = data.user as Person | null | undefined;
    if (user !== undefined) tokenOwner = user ? { id: user.id, displayName: user.displayName } : null;
  }
  return data as T;
}

export const api = {
  get: <T>(url: string) => request<T>('GET', url),
  post: <T>(url: string, body: Json = {}) => request<T>('POST', url, body),
  patch: <T>(url: string, body: Json) => request<T>('PATCH', url, body),
  put: <T>(url: string, body: Json, opts?: WriteOptions) => request<T>('PUT', url, body, opts),
  delete: <T>(url: string) => request<T>('DELETE', url),
};

declare module '@tanstack/react-query' {
  interface Register {
    defaultError: ApiError;
  }
}
