/**
 * Every route of the e-mail work with every role, no token, an expired token and a forged one:
 * the Outbox and the sending of links are for admins only; the set-password routes are public
 * (the e-mailed token is the credential) and answer the same whoever calls.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import jwt from 'jsonwebtoken';
import { ROLES, type Role } from '../../shared/api/auth.js';
import { sendMail } from '../../server/services/mail/send-mail.js';
import { startTestApp, type TestApp } from '../support/test-app.js';

let t: TestApp;
let target: { id: number };
let outboxId = 0;
const tokens = {} as Record<Role, string>;
let expiredToken = '';
let forgedToken = '';

beforeAll(async () => {
  t = await startTestApp();
  for (const role of ROLES) tokens[role] = (await t.addUser(role)).token;
  target = await t.addUser('designer');
  outboxId = (await sendMail(t.config.smtp, { to: 'someone@tarnwick.example', subject: 'Seen by admins only', text: 'x' }, { purpose: 'invitation', actorId: null })).id;
  const adminId = (jwt.decode(tokens.admin) as { sub: string }).sub;
  expiredToken = jwt.sign({ sub: adminId, exp: Math.floor(Date.now() / 1000) - 5 }, t.config.jwtSecret);
  forgedToken = jwt.sign({ sub: adminId }, 'an-attacker-secret-that-is-long-enough-000');
});
afterAll(async () => {
  await t?.close();
});

type Caller = { label: string; token: () => string | undefined; adminOnlyStatus: number | 'ok' };
const callers: Caller[] = [
  ...ROLES.map((role): Caller => ({ label: `role ${role}`, token: () => tokens[role], adminOnlyStatus: role === 'admin' ? 'ok' : 403 })),
  { label: 'no token', token: () => undefined, adminOnlyStatus: 401 },
  { label: 'expired token', token: () => expiredToken, adminOnlyStatus: 401 },
  { label: 'forged token', token: () => forgedToken, adminOnlyStatus: 401 },
];

interface RouteCase {
  method: 'get' | 'post';
  path: () => string;
  label: string;
  body?: object;
  /** Status for an admin (admin-only routes) or for anyone (public routes). */
  ok: number;
  public?: boolean;
}
const ROUTES: RouteCase[] = [
  { method: 'get', label: '/api/outbox', path: () => '/api/outbox', ok: 200 },
  { method: 'get', label: '/api/outbox/:id', path: () => `/api/outbox/${outboxId}`, ok: 200 },
  { method: 'post', label: '/api/users/:id/invitation', path: () => `/api/users/${target.id}/invitation`, body: {}, ok: 201 },
  { method: 'post', label: '/api/users/:id/password-reset', path: () => `/api/users/${target.id}/password-reset`, body: {}, ok: 201 },
  // Public: a token nobody was sent, so the answer is the same 400 whoever asks.
  { method: 'post', label: '/api/auth/set-password/check', path: () => '/api/auth/set-password/check', body: { token: 'B'.repeat(43) }, ok: 400, public: true },
  { method: 'post', label: '/api/auth/set-password', path: () => '/api/auth/set-password', body: { token: 'B'.repeat(43), password: 'long-enough-pw' }, ok: 400, public: true },
];

describe('e-mail routes by caller', () => {
  for (const route of ROUTES) {
    for (const caller of callers) {
      const expected = route.public || caller.adminOnlyStatus === 'ok' ? route.ok : caller.adminOnlyStatus;
      it(`${route.method.toUpperCase()} ${route.label} as ${caller.label} → ${expected}`, async () => {
        let req = request(t.app)[route.method](route.path());
        const token = caller.token();
        if (token) req = req.set('Authorization', `Bearer ${token}`);
        const res = await (route.body ? req.send(route.body) : req);
        expect(res.status).toBe(expected);
        if (res.status >= 400) expect(res.body.error.code).toBe(route.public ? 'token_invalid' : expected === 403 ? 'forbidden' : 'not_signed_in');
      });
    }
  }

  it('leaves the other /api/users routes to their own router (an admin still lists users)', async () => {
    const res = await request(t.app).get('/api/users').set('Authorization', `Bearer ${tokens.admin}`);
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
  });
});
