import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, type Http, signedIn } from '../support/http';
import { makeActivePlan, makePart, makeSupplier } from '../support/factories';

/**
 * Hostile input on every mutating route, generated from the OpenAPI request schemas (which are
 * generated from the zod schemas): each property alone set to each hostile value, plus
 * malformed JSON and wrong content types. Every answer is a 4xx with the error envelope, never a
 * 500, and no business table gains a row.
 */
let t: TestApp;
let eng: Http;
let ids: Record<string, string>;

const MB = 'x'.repeat(1024 * 1024);
const HOSTILE: unknown[] = [
  null,
  '',
  MB,
  -1,
  0,
  1e308,
  -1e308,
  Number.MAX_SAFE_INTEGER + 2,
  'NaN',
  'Infinity',
  true,
  [],
  {},
  [[[[[[]]]]]],
  "'; drop table lot; --",
  '<script>alert(1)</script>',
  '\u0000\u0001\u001f',
  'ｔｅｓｔ \u202e\u200b 🧲 ŵ',
  '../../etc/passwd',
];

async function rowCounts(): Promise<Record<string, number>> {
  const { rows } = await t.pool.query<{ t: string }>(`select tablename as t from pg_tables where schemaname = 'public' and tablename not in ('session', 'rate_limit', '__drizzle_migrations') order by 1`);
  const out: Record<string, number> = {};
  for (const r of rows) out[r.t] = Number((await t.pool.query(`select count(*) as n from "${r.t}"`)).rows[0].n);
  return out;
}

beforeAll(async () => {
  t = await startTestApp();
  eng = await signedIn(t.url, DEMO.engineer);
  const s = await makeSupplier(eng);
  const p = await makePart(eng);
  const plan = await makeActivePlan(eng, p.id);
  const l = await eng.post('/api/lots', { supplierId: s.id, partId: p.id, supplierLotNumber: 'HOSTILE-1', quantity: 20 });
  ids = { supplier: s.id, part: p.id, plan: plan.id, lot: l.body.id };
}, 60_000);
afterAll(async () => {
  await t?.close();
});

function pathWithIds(path: string): string {
  if (path.startsWith('/api/suppliers/')) return path.replace('{id}', ids.supplier);
  if (path.startsWith('/api/parts/')) return path.replace('{id}', ids.part);
  if (path.startsWith('/api/plans/')) return path.replace('{id}', ids.plan);
  if (path.startsWith('/api/lots/')) return path.replace('{id}', ids.lot);
  return path.replace(/\{[^}]+\}/g, '7f1c9a52-0000-4000-8000-000000000000');
}

describe('hostile input', () => {
  it('never answers 500 and stores nothing, on any mutating route', async () => {
    const before = await rowCounts();
    const problems: string[] = [];
    let calls = 0;
    const skip = new Set(['/api/auth/logout']);
    for (const [path, ops] of Object.entries(t.openapi.paths)) {
      for (const [method, op] of Object.entries(ops as Record<string, { requestBody?: { content?: Record<string, { schema?: { properties?: Record<string, unknown> } }> } }>)) {
        if (method === 'get' || skip.has(path)) continue;
        const url = pathWithIds(path);
        const props = Object.keys(op.requestBody?.content?.['application/json']?.schema?.properties ?? { value: 1 });
        const send = async (body: unknown, opts: { raw?: string; type?: string } = {}) => {
          calls++;
          const r = opts.raw !== undefined ? await eng.request(method.toUpperCase(), url, undefined, { raw: opts.raw, headers: { 'content-type': opts.type ?? 'application/json' } }) : await eng.request(method.toUpperCase(), url, body);
          const label = `${method.toUpperCase()} ${path} ${opts.raw !== undefined ? `raw ${opts.raw.slice(0, 20)} (${opts.type})` : JSON.stringify(body).slice(0, 60)}`;
          if (r.status >= 500) problems.push(`${label} → ${r.status} ${JSON.stringify(r.body).slice(0, 200)}`);
          else if (r.status < 400 && !path.startsWith('/api/calc') && path !== '/api/auth/password') problems.push(`${label} → ${r.status} (accepted)`);
          else if (r.status >= 400 && typeof r.body?.error !== 'string') problems.push(`${label} → ${r.status} without the error envelope`);
        };
        for (const prop of props) for (const v of HOSTILE) await send({ [prop]: v });
        await send(undefined, { raw: '{"unterminated": ' });
        await send(undefined, { raw: 'a=1&b=2', type: 'application/x-www-form-urlencoded' });
        await send(undefined, { raw: '<xml/>', type: 'text/xml' });
        await send({ ...Object.fromEntries(props.map((p) => [p, null])), unexpected: 'extra field' });
      }
    }
    expect(calls).toBeGreaterThan(500);
    expect(problems).toEqual([]);
    expect(await rowCounts()).toEqual(before);
  }, 300_000);

  it('refuses NUL characters in query strings too', async () => {
    const r = await eng.get('/api/suppliers?q=%00abc');
    expect(r.status).toBe(400);
  });
});
