import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DiscoveryService, MetadataScanner, Reflector } from '@nestjs/core';
import { PATH_METADATA, METHOD_METADATA } from '@nestjs/common/constants';
import { startTestApp, type TestApp } from '../support/test-app';
import { DEMO, Http, signedIn } from '../support/http';
import { ROLES_KEY } from '../../src-api/common/roles.decorator';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('deny by default', () => {
  it('every registered route declares its roles', () => {
    const discovery = t.app.get(DiscoveryService);
    const scanner = t.app.get(MetadataScanner);
    const reflector = t.app.get(Reflector);
    const routes: string[] = [];
    const missing: string[] = [];
    for (const wrapper of discovery.getControllers()) {
      const proto = wrapper.metatype?.prototype as Record<string, unknown> | undefined;
      if (!proto || !wrapper.metatype) continue;
      for (const name of scanner.getAllMethodNames(proto)) {
        const handler = proto[name] as (...a: unknown[]) => unknown;
        if (Reflect.getMetadata(METHOD_METADATA, handler) === undefined) continue;
        const path = `${Reflect.getMetadata(PATH_METADATA, wrapper.metatype) as string}/${Reflect.getMetadata(PATH_METADATA, handler) as string}`;
        routes.push(path);
        const roles = reflector.getAllAndOverride<string[] | undefined>(ROLES_KEY, [handler, wrapper.metatype]);
        if (!roles || roles.length === 0) missing.push(`${wrapper.name}.${name} (${path})`);
      }
    }
    expect(routes.length).toBeGreaterThan(8);
    expect(missing).toEqual([]);
  });

  it('every route in the OpenAPI document is one of them', () => {
    const paths = Object.keys(t.openapi.paths);
    expect(paths).toContain('/api/health');
    expect(paths).toContain('/api/auth/login');
    expect(paths).toContain('/api/users/{id}');
  });
});

describe('role checks', () => {
  it('refuses an admin route to an inspector (403) and to a signed-out client (401)', async () => {
    const inspector = await signedIn(t.url, DEMO.inspector);
    const r = await inspector.get('/api/users');
    expect(r.status).toBe(403);
    expect(r.body).toMatchObject({ error: 'forbidden' });
    const anon = await new Http(t.url).get('/api/users');
    expect(anon.status).toBe(401);
  });

  it('lets the admin list users and refuses writes from an auditor', async () => {
    const admin = await signedIn(t.url, DEMO.admin);
    const list = await admin.get('/api/users?pageSize=50');
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(7);
    const auditor = await signedIn(t.url, DEMO.auditor);
    const w = await auditor.post('/api/users', { email: 'a@b.test', name: 'A', role: 'inspector', password: 'long-enough-pass' });
    expect(w.status).toBe(403);
  });

  it('a deactivated user is signed out at the next request', async () => {
    const admin = await signedIn(t.url, DEMO.admin);
    const made = await admin.post('/api/users', { email: 'temp@harrowgate.test', name: 'Temp', role: 'inspector', password: 'long-enough-pass' });
    const h = await signedIn(t.url, 'temp@harrowgate.test', 'long-enough-pass');
    expect((await h.get('/api/auth/me')).status).toBe(200);
    expect((await admin.patch(`/api/users/${made.body.id}`, { active: false })).status).toBe(200);
    expect((await h.get('/api/auth/me')).status).toBe(401);
  });

  it('validates user writes with field messages', async () => {
    const admin = await signedIn(t.url, DEMO.admin);
    const r = await admin.post('/api/users', { email: 'nope', role: 'wizard', password: 'x' });
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.fields).sort()).toEqual(['email', 'name', 'password', 'role']);
    const dup = await admin.post('/api/users', { email: DEMO.engineer, name: 'Twin', role: 'engineer', password: 'long-enough-pass' });
    expect(dup.status).toBe(409);
    const sup = await admin.post('/api/users', { email: 's@x.test', name: 'S', role: 'supplier', password: 'long-enough-pass' });
    expect(sup.status).toBe(400);
    expect(sup.body.fields.supplierId).toMatch(/needs a supplier/);
  });
});

describe('OpenAPI', () => {
  it('serves the document generated from the zod schemas', async () => {
    const r = await new Http(t.url).get('/api/docs-json');
    expect(r.status).toBe(200);
    const login = r.body.paths['/api/auth/login'].post;
    expect(login.requestBody.content['application/json'].schema.properties.email).toBeTruthy();
  });
});
