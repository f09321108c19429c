import type { ErrorEnvelope } from '@shared/schemas/common';

/** An API error carrying the envelope: `error` code, readable `message`, optional per-field messages. */
export class ApiError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

let csrfToken: string | null = null;
let onUnauthenticated: (() => void) | null = null;

/** The app shell registers what to do when the session has ended (go to sign-in). */
export function setUnauthenticatedHandler(fn: () => void): void {
  onUnauthenticated = fn;
}
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

async function fetchCsrf(): Promise<string> {
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  const body = (await res.json()) as { token: string };
  csrfToken = body.token;
  return body.token;
}

/**
 * The CSRF header for a write sent outside `api()` (an XMLHttpRequest upload that reports
 * progress). `refresh` fetches a new token, after the server refused the old one.
 */
export async function csrfHeader(refresh = false): Promise<Record<string, string>> {
  return { 'x-csrf-token': !refresh && csrfToken ? csrfToken : await fetchCsrf() };
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  query?: Record<string, string | number | boolean | undefined | null>;
  signal?: AbortSignal;
  /** Do not redirect to sign-in on 401 (the sign-in form itself, the "who am I" probe). */
  quiet401?: boolean;
}

function buildUrl(path: string, query?: RequestOptions['query']): string {
  if (!query) return path;
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== '') p.set(k, String(v));
  const s = p.toString();
  return s ? `${path}?${s}` : path;
}

/** The one client: sends the CSRF token on writes, maps the error envelope, handles 401 once. */
export async function api<T>(path: string, opts: RequestOptions = {}, retried = false): Promise<T> {
  const method = opts.method ?? 'GET';
  const headers: Record<string, string> = { accept: 'application/json' };
  const isForm = typeof FormData !== 'undefined' && opts.body instanceof FormData;
  if (opts.body !== undefined && !isForm) headers['content-type'] = 'application/json';
  if (method !== 'GET') headers['x-csrf-token'] = csrfToken ?? (await fetchCsrf());
  let res: Response;
  try {
    res = await fetch(buildUrl(`/api${path}`, opts.query), {
      method,
      headers,
      credentials: 'same-origin',
      signal: opts.signal,
      body: opts.body === undefined ? undefined : isForm ? (opts.body as FormData) : JSON.stringify(opts.body),
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(0, 'offline', 'The server cannot be reached. Check the connection; nothing was lost.');
  }
  if (res.status === 204) return undefined as T;
  const text = await res.text();
  let body: unknown = undefined;
  try {
    body = text ? JSON.parse(text) : undefined;
  } catch {
    body = undefined;
  }
  if (res.ok) return body as T;
  const env = (body ?? {}) as Partial<ErrorEnvelope>;
  if (res.status === 403 && env.error === 'csrf' && !retried) {
    await fetchCsrf();
    return api<T>(path, opts, true);
  }
  if (res.status === 401 && !opts.quiet401) onUnauthenticated?.();
  throw new ApiError(res.status, env.error ?? 'error', env.message ?? `Request failed (${res.status})`, env.fields);
}
