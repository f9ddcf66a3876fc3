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

let csrfToken = '';
export const setCsrfToken = (token: string) => {
  csrfToken = token;
};
/** For requests that cannot go through `api` (multipart uploads). */
export const getCsrfToken = () => csrfToken;

type Json = Record<string, unknown> | unknown[];

async function request<T>(method: string, url: string, body?: Json, retried = false): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') headers['X-CSRF-Token'] = csrfToken;
  let res: Response;
  try {
    res = await fetch(url, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'Cannot reach the Benchwright server. Check the connection and try again.');
  }
  const text = await res.text();
  const data = text ? (JSON.parse(text) as Record<string, unknown>) : {};
  // The token went stale (a sign-in in another tab, or an answer to an older request arriving
  // last): fetch the session's current one and send the write once more.
  if (res.status === 403 && data.code === 'csrf' && method !== 'GET' && !retried) {
    await request('GET', '/api/auth/session');
    return request<T>(method, url, body, true);
  }
  if (!res.ok) {
    const message = typeof data.error === 'string' ? data.error : `The server answered ${res.status}.`;
    throw new ApiError(res.status, message, (data.fields as FieldProblem[]) ?? [], data);
  }
  if (typeof data.csrfToken === 'string') setCsrfToken(data.csrfToken);
  return data as T;
}

export const api = {
  get: <T>(url: string) => request<T>('GET', url),
  post: <T>(url: string, body: Json = {}) => request<T>('POST', url, body),
  patch: <T>(url: string, body: Json) => request<T>('PATCH', url, body),
  put: <T>(url: string, body: Json) => request<T>('PUT', url, body),
  delete: <T>(url: string) => request<T>('DELETE', url),
};

declare module '@tanstack/react-query' {
  interface Register {
    defaultError: ApiError;
  }
}
