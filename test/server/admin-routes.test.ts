import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import jwt from 'jsonwebtoken';
import { ROLES, type Role } from '../../shared/api/auth.js';
import { startTestApp, type TestApp } from '../support/test-app.js';

/** Every admin-only route, with a body that would succeed for an admin. */
const ADMIN_ROUTES: { method: 'get' | 'post' | 'patch'; path: (targetId: number) => string; body?: (n: number) => object; ok: number }[] = [
  { method: 'get', path: () => '/api/users', ok: 200 },
  { method: 'post', path: () => '/api/users', body: (n) => ({ email: `made-${n}@test.example`, name: 'Made', role: 'designer', password: 'a-first-password' }), ok: 201 },
  { method: 'patch', path: (id) => `/api/users/${id}`, body: () => ({ name: 'Renamed' }), ok: 200 },
];

type Caller = { label: string; token: () => string | undefined; status: number };

let t: TestApp;
let target: { id: number };
const tokens = {} as Record<Role, string>;
let deactivatedToken = '';
let expiredToken = '';
let forgedToken = '';

beforeAll(async () => {
  t = await startTestApp();
  for (const role of ROLES) tokens[role] = (await t.addUser(role)).token;
  target = await t.addUser('stores');
  const gone = await t.addUser('admin');
  deactivatedToken = gone.token;
  await t.sequelize.query('UPDATE users SET active = false WHERE id = :id', { replacements: { id: gone.id } });
  const adminId = (jwt.decode(tokens.admin) as { sub: string }).sub;
  expiredToken = jwt.sign({ sub: adminId, exp: Math.floor(Date.now() / 1000) - 5 }, t.config.jwtSecret);
  forgedToken = jwt.sign({ sub: adminId }, 'an-attacker-secret-that-is-long-enough-000');
});
afterAll(async () => {
  await t?.close();
});

const callers: Caller[] = [
  ...ROLES.map((role) => ({ label: `role ${role}`, token: () => tokens[role], status: role === 'admin' ? 0 : 403 })),
  { label: 'no token', token: () => undefined, status: 401 },
  { label: 'expired token', token: () => expiredToken, status: 401 },
  { label: 'forged token', token: () => forgedToken, status: 401 },
  { label: 'deactivated admin', token: () => deactivatedToken, status: 401 },
];

describe('admin routes by caller', () => {
  let n = 0;
  for (const route of ADMIN_ROUTES) {
    for (const caller of callers) {
      it(`${route.method.toUpperCase()} ${route.path(0).replace('/0', '/:id')} as ${caller.label}`, async () => {
        n += 1;
        let req = request(t.app)[route.method](route.path(target.id));
        const token = caller.token();
        if (token) req = req.set('Authorization', `Bearer ${token}`);
        const res = await (route.body ? req.send(route.body(n)) : req);
        expect(res.status).toBe(caller.status || route.ok);
        if (res.status >= 400) expect(res.body.error.code).toMatch(/^[a-z_]+$/);
      });
    }
  }
});
