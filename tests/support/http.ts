/**
 * A small HTTP client for API tests: keeps cookies like a browser, fetches and sends the
 * CSRF token, and returns status + parsed body.
 */
export interface Res<T = any> {
  status: number;
  body: T;
  headers: Headers;
}

export class Http {
  cookies = new Map<string, string>();
  csrf: string | null = null;

  constructor(public base: string) {}

  /** Same cookies, another server (two API processes sharing sessions). */
  pointedAt(base: string): Http {
    const h = new Http(base);
    h.cookies = this.cookies;
    h.csrf = this.csrf;
    return h;
  }

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  sessionId(): string | undefined {
    return this.cookies.get('yokeline.sid');
  }

  async request<T = any>(method: string, path: string, body?: unknown, opts: { csrf?: boolean; headers?: Record<string, string>; raw?: BodyInit } = {}): Promise<Res<T>> {
    const headers: Record<string, string> = { ...(opts.headers ?? {}) };
    if (method !== 'GET' && opts.csrf !== false) {
      if (!this.csrf) await this.fetchCsrf();
      headers['x-csrf-token'] = this.csrf!;
    }
    if (this.cookies.size) headers.cookie = this.cookieHeader();
    let payload: BodyInit | undefined = opts.raw;
    if (body !== undefined && payload === undefined) {
      if (body instanceof FormData) payload = body;
      else {
        headers['content-type'] ??= 'application/json';
        payload = JSON.stringify(body);
      }
    }
    const res = await fetch(this.base + path, { method, headers, body: payload, redirect: 'manual' });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
    const text = await res.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : undefined;
    } catch {
      /* not JSON */
    }
    return { status: res.status, body: parsed as T, headers: res.headers };
  }

  async fetchCsrf(): Promise<string> {
    const r = await this.request<{ token: string }>('GET', '/api/auth/csrf');
    this.csrf = r.body.token;
    return this.csrf;
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path);
  }
  post<T = any>(path: string, body?: unknown, opts?: { csrf?: boolean }) {
    return this.request<T>('POST', path, body ?? {}, opts);
  }
  put<T = any>(path: string, body?: unknown) {
    return this.request<T>('PUT', path, body ?? {});
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.request<T>('PATCH', path, body ?? {});
  }
  del<T = any>(path: string) {
    return this.request<T>('DELETE', path);
  }

  async login(email: string, password = 'yokeline-demo'): Promise<Res> {
    const r = await this.post('/api/auth/login', { email, password });
    if (r.status === 200) this.csrf = r.body.csrfToken;
    return r;
  }
}

export async function signedIn(base: string, email: string, password = 'yokeline-demo'): Promise<Http> {
  const h = new Http(base);
  const r = await h.login(email, password);
  if (r.status !== 200) throw new Error(`sign-in as ${email} failed: ${r.status} ${JSON.stringify(r.body)}`);
  return h;
}

export const DEMO = {
  inspector: 'inspector@harrowgate.test',
  engineer: 'engineer@harrowgate.test',
  auditor: 'auditor@harrowgate.test',
  admin: 'admin@harrowgate.test',
  supplierNorthgate: 'quality@northgate-lamination.test',
  supplierSelby: 'quality@selby-pressworks.test',
  supplierOkaro: 'quality@okaro-stamping.test',
} as const;
