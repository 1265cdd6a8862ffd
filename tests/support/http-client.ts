/**
 * A fetch wrapper that keeps cookies like a browser and sends the Origin
 * header better-auth requires. Kept to a few lines: the app only sets plain
 * session cookies on one host, so a full cookie-jar library adds nothing here.
 */
export function httpClient(base: string, opts: { origin?: string; jar?: Map<string, string> } = {}) {
  const jar = opts.jar ?? new Map<string, string>();
  async function call(method: string, path: string, body?: unknown, init: RequestInit = {}) {
    const headers = new Headers(init.headers);
    headers.set('origin', opts.origin ?? base);
    if (jar.size) headers.set('cookie', [...jar].map(([k, v]) => `${k}=${v}`).join('; '));
    if (body !== undefined) headers.set('content-type', 'application/json');
    const res = await fetch(new URL(path, base), {
      method,
      redirect: 'manual',
      ...init,
      headers,
      body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
    });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i).trim();
      const value = pair.slice(i + 1).trim();
      if (value === '' || /max-age=0/i.test(c)) jar.delete(name);
      else jar.set(name, value);
    }
    const text = await res.text();
    let json: any = null;
    try {
      json = text ? JSON.parse(text) : null;
    } catch {
      json = null;
    }
    return { status: res.status, headers: res.headers, json, text };
  }
  return {
    get: (p: string) => call('GET', p),
    post: (p: string, body: unknown = {}) => call('POST', p, body),
    patch: (p: string, body: unknown) => call('PATCH', p, body),
    put: (p: string, body: unknown) => call('PUT', p, body),
    delete: (p: string) => call('DELETE', p),
    raw: call,
    hasSession: () => [...jar.keys()].some((k) => k.includes('session_token')),
    /** The same browser (cookies, Origin) talking to another instance behind the same public address. */
    via: (otherBase: string) => httpClient(otherBase, { origin: opts.origin ?? base, jar }),
  };
}

export type HttpClient = ReturnType<typeof httpClient>;
