/** A minimal cookie-keeping client for a server in another process (fetch, one session). */
export function httpSession(baseUrl: string) {
  let cookie = '';
  let csrf = '';
  const keep = (res: Response) => {
    const set = res.headers.getSetCookie?.() ?? [];
    const sid = set.find((c) => c.startsWith('bw.sid='));
    if (sid) cookie = sid.split(';')[0]!;
  };
  const call = async (method: string, path: string, body?: unknown) => {
    const res = await fetch(baseUrl + path, {
      method,
      headers: { 'content-type': 'application/json', cookie, 'x-csrf-token': csrf },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    keep(res);
    const json = (await res.json().catch(() => ({}))) as Record<string, unknown>;
    if (typeof json.csrfToken === 'string') csrf = json.csrfToken;
    return { status: res.status, body: json };
  };
  return {
    cookieHeader: () => cookie,
    csrfToken: () => csrf,
    call,
    get: (path: string) => call('GET', path),
    post: (path: string, body: unknown = {}) => call('POST', path, body),
    async signIn(email: string, password: string) {
      await call('GET', '/api/auth/session');
      return call('POST', '/api/auth/sign-in', { email, password });
    },
  };
}
