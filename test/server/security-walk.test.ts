/**
 * The security walk: every API route with every role, no token, an expired token, a forged token and
 * a deactivated user. The table below is the rule of product.md and api.md ("every signed-in role may
 * read stock and matches; only the role named may change each thing"); the test fails when the app
 * has a route the table does not list, so a new route cannot ship without a decision here.
 *
 * A caller the role gate lets through may still get 400 or 404 (the walk sends no body and unknown
 * ids); what it must never get is 401 or 403. Where the role depends on the body (a build's status
 * change), only the sign-in checks apply and the service's own tests cover the roles.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import jwt from 'jsonwebtoken';
import { ROLES, type Role } from '../../shared/api/auth.js';
import { startTestApp, type TestApp } from '../support/test-app.js';
import { listApiRoutes } from '../support/route-list.js';

const ALL = 'all' as const;
type Rule = { public: true } | { roles: readonly Role[] | typeof ALL } | { bodyDependent: true };

const RULES: Record<string, Rule> = {
  'GET /api/health': { public: true },
  'POST /api/auth/login': { public: true },
  'POST /api/auth/set-password': { public: true },
  'POST /api/auth/set-password/check': { public: true },
  'GET /api/auth/me': { roles: ALL },
  'GET /api/users': { roles: ['admin'] },
  'POST /api/users': { roles: ['admin'] },
  'PATCH /api/users/:id': { roles: ['admin'] },
  'POST /api/users/:id/invitation': { roles: ['admin'] },
  'POST /api/users/:id/password-reset': { roles: ['admin'] },
  'GET /api/outbox': { roles: ['admin'] },
  'GET /api/outbox/:id': { roles: ['admin'] },
  'GET /api/settings': { roles: ALL },
  'PUT /api/settings': { roles: ['admin'] },
  'GET /api/parts': { roles: ALL },
  'GET /api/parts/:id': { roles: ALL },
  'GET /api/parts/export.csv': { roles: ALL },
  'GET /api/parts/locations': { roles: ALL },
  'GET /api/stock/imports': { roles: ALL },
  'GET /api/stock/imports/:id': { roles: ALL },
  'POST /api/stock/imports': { roles: ['stores', 'admin'] },
  'POST /api/matches/solve': { roles: ALL },
  'GET /api/matches': { roles: ALL },
  'GET /api/matches/:id': { roles: ALL },
  'POST /api/matches': { roles: ['designer', 'admin'] },
  'DELETE /api/matches/:id': { roles: ['designer', 'admin'] },
  'GET /api/matches/:id/touchstone': { roles: ALL },
  'GET /api/builds': { roles: ALL },
  'GET /api/builds/:id': { roles: ALL },
  'POST /api/builds': { roles: ['designer', 'admin'] },
  'POST /api/builds/:id/reserve': { roles: ['designer', 'admin'] },
  'PATCH /api/builds/:id': { bodyDependent: true },
  'GET /api/builds/:id/shortfall': { roles: ALL },
  'GET /api/builds/:id/shortfall.csv': { roles: ALL },
  'PATCH /api/builds/:id/shortfall': { roles: ['purchasing', 'admin'] },
  'POST /api/builds/:id/shortfall/send': { roles: ['purchasing', 'admin'] },
  'POST /api/builds/:id/shortfall/receive': { roles: ['purchasing', 'stores', 'admin'] },
  'GET /api/shortfall': { roles: ALL },
};

let t: TestApp;
const tokens = {} as Record<Role, string>;
let expired = '';
let forged = '';
let deactivated = '';

beforeAll(async () => {
  t = await startTestApp();
  for (const role of ROLES) tokens[role] = (await t.addUser(role)).token;
  const adminId = (jwt.decode(tokens.admin) as { sub: string }).sub;
  expired = jwt.sign({ sub: adminId, exp: Math.floor(Date.now() / 1000) - 5 }, t.config.jwtSecret);
  forged = jwt.sign({ sub: adminId }, 'an-attacker-secret-that-is-long-enough-000');
  const gone = await t.addUser('admin');
  deactivated = gone.token;
  await t.sequelize.query('UPDATE users SET active = false WHERE id = :id', { replacements: { id: gone.id } });
});
afterAll(async () => {
  await t?.close();
});

/** Sends `route` (ids replaced by one that does not exist) with `token`, no body. */
function call(route: string, token?: string) {
  const [method, path] = route.split(' ');
  let req = request(t.app)[method.toLowerCase() as 'get'](path.replace(/:id/g, '999999'));
  if (token) req = req.set('Authorization', `Bearer ${token}`);
  return method === 'GET' ? req : req.send({});
}

describe('security walk', () => {
  it('has a rule for every route the app answers, and no rule for a route that is gone', () => {
    const routes = listApiRoutes(t.app);
    expect(routes.filter((r) => !(r in RULES))).toEqual([]);
    expect(Object.keys(RULES).filter((r) => !routes.includes(r))).toEqual([]);
  });

  for (const [route, rule] of Object.entries(RULES)) {
    if ('public' in rule) {
      it(`${route} answers without a sign-in (never 401 or 403)`, async () => {
        const res = await call(route);
        expect([401, 403]).not.toContain(res.status);
        expect(res.status).toBeLessThan(500);
      });
      continue;
    }
    it(`${route} refuses no token, an expired, a forged and a deactivated user's token with 401`, async () => {
      for (const token of [undefined, expired, forged, deactivated]) {
        const res = await call(route, token);
        expect(res.status, `token ${token ? token.slice(0, 12) : 'none'}`).toBe(401);
        expect(res.body.error.code).toBe('not_signed_in');
      }
    });
    if ('roles' in rule) {
      it(`${route} lets ${rule.roles === ALL ? 'every role' : rule.roles.join(', ')} through and refuses the others with 403`, async () => {
        for (const role of ROLES) {
          const res = await call(route, tokens[role]);
          const allowed = rule.roles === ALL || rule.roles.includes(role);
          if (allowed) expect([401, 403], `${role}: ${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status);
          else expect(res.status, `${role}`).toBe(403);
          expect(res.status, `${role}: ${JSON.stringify(res.body)}`).toBeLessThan(500);
        }
      });
    }
  }
});
