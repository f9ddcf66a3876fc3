/** A minimal cookie-keeping client for a server in another process (fetch, one session). */
export function httpSession(baseUrl: string) {
  // Every cookie the server sets (the session, and the anonymous visitor's CSRF cookie).
  const jar = new Map<string, string>();
  let csrf = '';
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie?.() ?? []) {
      const pair = c.split(';')[0]!;
      const name = pair.slice(0, pair.indexOf('='));
      if (/expires=Thu, 01 Jan 1970/i.test(c)) jar.delete(name);
      else jar.set(name, pair);
    }
  };
  const call = async (method: string, path: string, body?: unknown) => {
    const res = await fetch(baseUrl + path, {
      method,
      headers: {
        'content-type': 'application/json',
        cookie: [...jar.values()].join('; '),
        'x-csrf-token': csrf,
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    keep(res);
    const json = (await res.json().catch(() => ({}))) as Record<string, unknown>;
    if (typeof json.csrfToken === 'string') csrf = json.csrfToken;
    return { status: res.status, body: json, headers: res.headers };
  };
  return {
    /** The session cookie alone ("bw.sid=…"). */
    cookieHeader: () => jar.get('bw.sid') ?? '',
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
