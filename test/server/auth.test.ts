import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import jwt from 'jsonwebtoken';
import { QueryTypes } from 'sequelize';
import { startTestApp, TEST_PASSWORD, type TestApp } from '../support/test-app.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('POST /api/auth/login', () => {
  it('signs in with the right password and returns a token that works', async () => {
    const user = await t.addUser('designer', 'dana@test.example');
    const res = await request(t.app).post('/api/auth/login').send({ email: 'Dana@Test.Example ', password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({ id: user.id, email: 'dana@test.example', name: expect.any(String), role: 'designer', active: true, passwordSet: true });
    const me = await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${res.body.token}`);
    expect(me.status).toBe(200);
    expect(me.body.email).toBe('dana@test.example');
  });

  it('gives an unknown e-mail and a wrong password the same 401', async () => {
    await t.addUser('stores', 'sam@test.example');
    const wrong = await request(t.app).post('/api/auth/login').send({ email: 'sam@test.example', password: 'not the password' });
    const unknown = await request(t.app).post('/api/auth/login').send({ email: 'nobody@test.example', password: 'not the password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('not_signed_in');
    expect(wrong.body.token).toBeUndefined();
  });

  it('rejects a missing password with 400 naming the field', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'x@test.example' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toContainEqual(expect.objectContaining({ field: 'password' }));
  });

  it('stores only an argon2id hash of the password', async () => {
    const user = await t.addUser('purchasing');
    const [row] = await t.sequelize.query<{ password_hash: string }>('SELECT password_hash FROM users WHERE id = :id', {
      replacements: { id: user.id },
      type: QueryTypes.SELECT,
    });
    expect(row.password_hash.startsWith('$argon2id$')).toBe(true);
    expect(row.password_hash).not.toContain(TEST_PASSWORD);
  });
});

describe('tokens', () => {
  it('stops working when the user is deactivated', async () => {
    const admin = await t.addUser('admin');
    const user = await t.addUser('designer');
    expect((await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${user.token}`)).status).toBe(200);
    const patch = await request(t.app).patch(`/api/users/${user.id}`).set('Authorization', `Bearer ${admin.token}`).send({ active: false });
    expect(patch.status).toBe(200);
    const after = await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${user.token}`);
    expect(after.status).toBe(401);
    expect(after.body.error.message).toMatch(/deactivated/);
    const login = await request(t.app).post('/api/auth/login').send({ email: user.email, password: TEST_PASSWORD });
    expect(login.status).toBe(401);
  });

  it('refuses an expired token with a message that says so', async () => {
    const user = await t.addUser('designer');
    const expired = jwt.sign({ sub: String(user.id), exp: Math.floor(Date.now() / 1000) - 60 }, t.config.jwtSecret);
    const res = await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${expired}`);
    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/expired/);
  });

  it('refuses a token signed with another secret, and one with alg none', async () => {
    const user = await t.addUser('admin');
    const forged = jwt.sign({ sub: String(user.id) }, 'some-other-secret-of-sufficient-length-000');
    const none = jwt.sign({ sub: String(user.id) }, '', { algorithm: 'none' });
    for (const token of [forged, none, 'not.a.jwt']) {
      const res = await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${token}`);
      expect(res.status).toBe(401);
    }
  });

  it('lives as long as TOKEN_TTL says', async () => {
    const short = t.appWith({ TOKEN_TTL: '90s' });
    await t.addUser('designer', 'ttl@test.example');
    const res = await request(short.app).post('/api/auth/login').send({ email: 'ttl@test.example', password: TEST_PASSWORD });
    const shortPayload = jwt.decode(res.body.token) as { iat: number; exp: number };
    expect(shortPayload.exp - shortPayload.iat).toBe(90);
    const stores = await t.addUser('stores');
    const login = await request(t.app).post('/api/auth/login').send({ email: stores.email, password: TEST_PASSWORD });
    expect(login.status).toBe(200);
    const payload = jwt.decode(login.body.token) as { iat: number; exp: number };
    expect(payload.exp - payload.iat).toBe(8 * 3600);
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 after LOGIN_RATE_LIMIT attempts for one account from one address', async () => {
    const limited = t.appWith({ LOGIN_RATE_LIMIT: '3' });
    {
      await t.addUser('designer', 'rl@test.example');
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++) {
        statuses.push((await request(limited.app).post('/api/auth/login').send({ email: 'rl@test.example', password: 'wrong' })).status);
      }
      expect(statuses).toEqual([401, 401, 401, 429, 429]);
      // Another account from the same address is not locked out by the first one's attempts.
      await t.addUser('stores', 'other@test.example');
      const other = await request(limited.app).post('/api/auth/login').send({ email: 'other@test.example', password: TEST_PASSWORD });
      expect(other.status).toBe(200);
    }
  });
});
