/** The one fetch wrapper: JSON (or a multipart upload) in, JSON out, the CSRF token on writes, one error type. */

export interface FieldProblem {
  /** Where, for machines: "body.model". */
  field: string;
  /** The field as its form labels it ("Model"); absent on a few older refusals. */
  label?: string;
  /** What is wrong, as a sentence naming the field where the server knows its label ("Model is required"). */
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

type Json = Record<string, unknown> | unknown[];

/** What to say when an error answer carries no message of its own (e.g. a proxy's page). */
const STATUS_MESSAGES: Record<number, string> = {
  413: 'That is too large for the server to accept.',
  415: 'That type of file is not accepted.',
};

export interface WriteOptions {
  /** Who made this write (a queued entry keeps its maker); by default whoever the token belonged to when it was sent. */
  madeBy?: Person | null;
}

async function request<T>(
  method: string,
  url: string,
  body?: Json | FormData,
  opts: WriteOptions & { retried?: boolean } = {},
): Promise<T> {
  const madeBy = opts.madeBy === undefined ? tokenOwner : opts.madeBy;
  const headers: Record<string, string> = { Accept: 'application/json' };
  const multipart = body instanceof FormData;
  // The browser sets a multipart body's Content-Type itself, with its boundary.
  if (body !== undefined && !multipart) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken;
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers,
      body: body === undefined || multipart ? body : JSON.stringify(body),
      credentials: 'same-origin',
    });
  } catch {
    throw new ApiError(0, 'Cannot reach the Benchwright server. Check the connection and try again.');
  }
  const data = parseJson(await res.text());
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
    const message =
      typeof data.error === 'string'
        ? data.error
        : (STATUS_MESSAGES[res.status] ?? `The server answered ${res.status}.`);
    throw new ApiError(res.status, message, (data.fields as FieldProblem[]) ?? [], data);
  }
  if (typeof data.csrfToken === 'string') {
    setCsrfToken(data.csrfToken);
    const user = data.user as Person | null | undefined;
    if (user !== undefined) tokenOwner = user ? { id: user.id, displayName: user.displayName } : null;
  }
  return data as T;
}

/** An answer that is not JSON (an empty body, a proxy's error page) reads as no fields. */
function parseJson(text: string): Record<string, unknown> {
  try {
    const data: unknown = text ? JSON.parse(text) : {};
    return data && typeof data === 'object' ? (data as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}

export const api = {
  get: <T>(url: string) => request<T>('GET', url),
  post: <T>(url: string, body: Json = {}) => request<T>('POST', url, body),
  patch: <T>(url: string, body: Json) => request<T>('PATCH', url, body),
  put: <T>(url: string, body: Json, opts?: WriteOptions) => request<T>('PUT', url, body, opts),
  delete: <T>(url: string) => request<T>('DELETE', url),
  /** Every file upload: multipart, the text fields first and the file as "file"; errors and CSRF retry as any write. */
  upload: <T>(url: string, file: File, fields: Record<string, string> = {}) => {
    const form = new FormData();
    for (const [k, v] of Object.entries(fields)) form.append(k, v);
    form.append('file', file);
    return request<T>('POST', url, form);
  },
};

declare module '@tanstack/react-query' {
  interface Register {
    defaultError: ApiError;
  }
}
