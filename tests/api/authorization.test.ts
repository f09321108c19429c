import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { POLICY } from './policy';
import type { Role } from '../../shared/schemas/auth';

let t: TestApp;
const as: Partial<Record<Role | 'anonymous', Http>> = {};
const ROLES: Role[] = ['inspector', 'engineer', 'supplier', 'auditor', 'admin'];
const EMAIL: Record<Role, string> = { inspector: DEMO.inspector, engineer: DEMO.engineer, supplier: DEMO.supplierNorthgate, auditor: DEMO.auditor, admin: DEMO.admin };
// An id that exists nowhere: allowed callers get 404 or 400, refused callers 403 before any lookup.
const NOBODY = '7f1c9a52-0000-4000-8000-000000000000';

beforeAll(async () => {
  t = await startTestApp();
  for (const r of ROLES) as[r] = await signedIn(t.url, EMAIL[r]);
  as.anonymous = new Http(t.url);
});
afterAll(async () => {
  await t?.close();
});

function routes(): string[] {
  const out: string[] = [];
  for (const [p, ops] of Object.entries(t.openapi.paths)) for (const m of Object.keys(ops as object)) out.push(`${m.toUpperCase()} ${p}`);
  return out;
}

// Routes whose call changes the caller's own session are checked last and on a throwaway session.
const SESSION_CHANGING = new Set(['POST /api/auth/logout', 'POST /api/auth/login']);

describe('authorization matrix', () => {
  it('has a policy row for every route in the OpenAPI document, and no stale rows', () => {
    const documented = routes();
    expect(documented.filter((r) => !POLICY[r])).toEqual([]);
    expect(Object.keys(POLICY).filter((r) => !documented.includes(r))).toEqual([]);
  });

  it('answers every route for every role as the policy says', async () => {
    const mismatches: string[] = [];
    for (const route of routes()) {
      const rule = POLICY[route];
      if (!rule) continue;
      const [method, path] = route.split(' ');
      const url = path.replace(/\{[^}]+\}/g, NOBODY);
      for (const who of [...ROLES, 'anonymous' as const]) {
        let client = as[who]!;
        if (SESSION_CHANGING.has(route) && who !== 'anonymous') client = await signedIn(t.url, EMAIL[who]);
        const body = method === 'GET' ? undefined : {};
        const r = await client.request(method, url, body);
        const allowed = rule.allow === 'public' || (who !== 'anonymous' && rule.allow.includes(who));
        const refusedAs = who === 'anonymous' ? 401 : 403;
        const ok = allowed ? r.status !== 401 && r.status !== 403 && r.status < 500 : r.status === refusedAs;
        if (!ok) mismatches.push(`${route} as ${who}: got ${r.status}, expected ${allowed ? 'allowed' : refusedAs}`);
        if (r.status >= 400) expect(typeof r.body?.error, `${route} as ${who} answers the error envelope`).toBe('string');
      }
    }
    expect(mismatches).toEqual([]);
  });

  it('refuses every write to auditors', () => {
    const writes = routes().filter((r) => !r.startsWith('GET ') && POLICY[r]?.allow !== 'public' && !POLICY[r]?.pure && !['POST /api/auth/logout', 'POST /api/auth/password'].includes(r));
    expect(writes.filter((r) => (POLICY[r].allow as Role[]).includes('auditor'))).toEqual([]);
  });
});
