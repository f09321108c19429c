import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { appUser, auditEvent } from '../../src-api/db/schema';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ config: { LOGIN_MAX_FAILURES: 10 } });
});
afterAll(async () => {
  await t?.close();
});

describe('GET /api/health', () => {
  it('reports the database up', async () => {
    const r = await new Http(t.url).get('/api/health');
    expect(r.status).toBe(200);
    expect(r.body).toEqual({ status: 'ok', db: 'up' });
  });
});

describe('CSRF', () => {
  it('refuses a login without the X-CSRF-Token header', async () => {
    const h = new Http(t.url);
    await h.fetchCsrf();
    const r = await h.post('/api/auth/login', { email: DEMO.engineer, password: 'yokeline-demo' }, { csrf: false });
    expect(r.status).toBe(403);
    expect(r.body.error).toBe('csrf');
  });

  it('refuses a token from another session', async () => {
    const a = new Http(t.url);
    const b = new Http(t.url);
    const tokenA = await a.fetchCsrf();
    await b.fetchCsrf();
    b.csrf = tokenA;
    const r = await b.post('/api/auth/login', { email: DEMO.engineer, password: 'yokeline-demo' });
    expect(r.status).toBe(403);
    expect(r.body.error).toBe('csrf');
  });

  it('refuses a write from a signed-in session that lost its token', async () => {
    const h = await signedIn(t.url, DEMO.admin);
    const r = await h.post('/api/users', { email: 'x@harrowgate.test' }, { csrf: false });
    expect(r.status).toBe(403);
    expect(r.body).toMatchObject({ error: 'csrf' });
  });

  it('refuses a cross-origin write', async () => {
    const h = new Http(t.url);
    await h.fetchCsrf();
    const r = await h.request('POST', '/api/auth/login', { email: DEMO.engineer, password: 'x' }, { headers: { origin: 'http://evil.example' } });
    expect(r.status).toBe(403);
  });
});

describe('POST /api/auth/login', () => {
  it('signs in and returns the user without secrets', async () => {
    const h = new Http(t.url);
    const r = await h.login(DEMO.engineer);
    expect(r.status).toBe(200);
    expect(r.body.user).toMatchObject({ email: DEMO.engineer, role: 'engineer', supplierId: null });
    expect(Object.keys(r.body.user).sort()).toEqual(['email', 'id', 'name', 'role', 'supplierId']);
  });

  it('gives one 401 message for a wrong password and an unknown e-mail', async () => {
    const wrong = await new Http(t.url).login(DEMO.inspector, 'not-the-password');
    const unknown = await new Http(t.url).login('nobody@harrowgate.test', 'not-the-password');
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
  });

  it('answers 400 with field messages for a malformed body', async () => {
    const r = await new Http(t.url).post('/api/auth/login', { email: 'not-an-email' });
    expect(r.status).toBe(400);
    expect(r.body.error).toBe('validation');
    expect(r.body.fields.email).toMatch(/valid e-mail/);
    expect(r.body.fields.password).toBeTruthy();
  });

  it('rotates the session id on sign-in', async () => {
    const h = new Http(t.url);
    await h.fetchCsrf();
    const before = h.sessionId();
    expect(before).toBeTruthy();
    await h.login(DEMO.engineer);
    expect(h.sessionId()).toBeTruthy();
    expect(h.sessionId()).not.toBe(before);
  });

  it('locks the account after 10 failures in the window, with a clear 429', async () => {
    const email = 'lockme@harrowgate.test';
    const admin = await signedIn(t.url, DEMO.admin);
    expect((await admin.post('/api/users', { email, name: 'Lock Me', role: 'inspector', password: 'a-long-enough-password' })).status).toBe(201);
    for (let i = 0; i < 9; i++) expect((await new Http(t.url).login(email, 'wrong')).status).toBe(401);
    const tenth = await new Http(t.url).login(email, 'wrong');
    expect(tenth.status).toBe(429);
    expect(tenth.body.message).toMatch(/locked for 15 more minutes/);
    // Even the right password is refused while locked.
    const right = await new Http(t.url).login(email, 'a-long-enough-password');
    expect(right.status).toBe(429);
    const [row] = await t.db.select().from(appUser).where(eq(appUser.email, email));
    expect(row.lockedUntil!.getTime()).toBeGreaterThan(Date.now() + 14 * 60_000);
    const events = await t.db.select().from(auditEvent).where(eq(auditEvent.entityId, row.id));
    expect(events.map((e) => e.action)).toContain('user.locked');
  });
});

describe('GET /api/auth/me and logout', () => {
  it('is 401 when signed out', async () => {
    const r = await new Http(t.url).get('/api/auth/me');
    expect(r.status).toBe(401);
    expect(r.body.error).toBe('unauthenticated');
  });

  it.each([
    [DEMO.inspector, 'inspector'],
    [DEMO.engineer, 'engineer'],
    [DEMO.auditor, 'auditor'],
    [DEMO.admin, 'admin'],
    [DEMO.supplierNorthgate, 'supplier'],
  ])('%s is a %s', async (email, role) => {
    const h = await signedIn(t.url, email);
    const r = await h.get('/api/auth/me');
    expect(r.status).toBe(200);
    expect(r.body.user.role).toBe(role);
    if (role === 'supplier') expect(r.body.user.supplierId).toMatch(/[0-9a-f-]{36}/);
    else expect(r.body.user.supplierId).toBeNull();
  });

  it('ends the session on sign-out', async () => {
    const h = await signedIn(t.url, DEMO.inspector);
    expect((await h.post('/api/auth/logout')).status).toBe(200);
    expect((await h.get('/api/auth/me')).status).toBe(401);
  });
});

describe('POST /api/auth/password', () => {
  it('refuses a short password and a wrong current password, then changes it', async () => {
    const admin = await signedIn(t.url, DEMO.admin);
    const email = 'pw@harrowgate.test';
    await admin.post('/api/users', { email, name: 'Pass Word', role: 'auditor', password: 'first-password-1' });
    const h = await signedIn(t.url, email, 'first-password-1');
    const short = await h.post('/api/auth/password', { currentPassword: 'first-password-1', newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.fields.newPassword).toMatch(/at least 12/);
    const wrong = await h.post('/api/auth/password', { currentPassword: 'nope', newPassword: 'second-password-2' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields.currentPassword).toBeTruthy();
    expect((await h.post('/api/auth/password', { currentPassword: 'first-password-1', newPassword: 'second-password-2' })).status).toBe(200);
    expect((await new Http(t.url).login(email, 'first-password-1')).status).toBe(401);
    expect((await new Http(t.url).login(email, 'second-password-2')).status).toBe(200);
  });
});

describe('two API processes', () => {
  it('share one session through PostgreSQL, and sign-out ends it on both', async () => {
    const second = await t.another();
    try {
      const h = await signedIn(t.url, DEMO.engineer);
      const other = h.pointedAt(second.url);
      const me = await other.get('/api/auth/me');
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(DEMO.engineer);
      expect((await other.post('/api/auth/logout')).status).toBe(200);
      expect((await h.get('/api/auth/me')).status).toBe(401);
    } finally {
      await second.close();
    }
  });
});

describe('rate limits', () => {
  it('answers 429 once one client makes too many sign-in attempts in a minute', async () => {
    const limited = await t.another({ LOGIN_RATE_PER_MINUTE: '5' });
    // The counters are shared by every process: start this client's window afresh.
    await t.pool.query(`delete from rate_limit where key like 'login:%'`);
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 7; i++) statuses.push((await new Http(limited.url).login(`nobody${i}@harrowgate.test`, 'x')).status);
      expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
      expect(statuses.slice(5)).toEqual([429, 429]);
    } finally {
      await limited.close();
    }
  });

  it('counts sign-in attempts across API processes, so a load balancer does not multiply the limit', async () => {
    const [a, b] = await Promise.all([t.another({ LOGIN_RATE_PER_MINUTE: '5' }), t.another({ LOGIN_RATE_PER_MINUTE: '5' })]);
    await t.pool.query(`delete from rate_limit where key like 'login:%'`);
    try {
      const answers = [];
      // Alternating between the two processes, as a load balancer would.
      for (let i = 0; i < 7; i++) answers.push(await new Http(i % 2 ? b.url : a.url).login(`nobody${i}@harrowgate.test`, 'x'));
      expect(answers.map((r) => r.status)).toEqual([401, 401, 401, 401, 401, 429, 429]);
      // The refusal says when to come back: within the minute's window.
      const wait = Number(answers[6].headers.get('retry-after'));
      expect(wait).toBeGreaterThan(0);
      expect(wait).toBeLessThanOrEqual(60);
      const [row] = (await t.pool.query<{ hits: number }>(`select hits from rate_limit where key like 'login:%'`)).rows;
      expect(row.hits).toBe(7);
    } finally {
      await Promise.all([a.close(), b.close()]);
    }
  });
});
