import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestApp } from '../support/test-app.js';

let t: TestApp;
let admin: { id: number; token: string };
beforeAll(async () => {
  t = await startTestApp();
  admin = await t.addUser('admin', 'boss@test.example');
});
afterAll(async () => {
  await t?.close();
});
const asAdmin = (r: request.Test) => r.set('Authorization', `Bearer ${admin.token}`);

describe('user administration', () => {
  it('creates a user who can then sign in, and records it in the audit table', async () => {
    const res = await asAdmin(request(t.app).post('/api/users')).send({ email: 'new@test.example', name: 'New Person', role: 'stores', password: 'first-password-1' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'new@test.example', role: 'stores', active: true });
    expect(res.body.passwordHash).toBeUndefined();
    const login = await request(t.app).post('/api/auth/login').send({ email: 'new@test.example', password: 'first-password-1' });
    expect(login.status).toBe(200);
    const audit = await t.sequelize.query<{ action: string; actor_id: number; after: { email: string } }>(
      "SELECT action, actor_id, after FROM audit_entries WHERE entity_type = 'user' AND entity_id = :id",
      { replacements: { id: String(res.body.id) }, type: QueryTypes.SELECT },
    );
    expect(audit).toEqual([{ action: 'user.create', actor_id: admin.id, after: expect.objectContaining({ email: 'new@test.example' }) }]);
  });

  it('lists users without hashes', async () => {
    const res = await asAdmin(request(t.app).get('/api/users'));
    expect(res.status).toBe(200);
    expect(res.body.items.map((u: { email: string }) => u.email)).toContain('boss@test.example');
    // Whether a password is set, never anything of it.
    for (const u of res.body.items) expect(Object.keys(u).sort()).toEqual(['active', 'email', 'id', 'name', 'passwordSet', 'role']);
    expect(JSON.stringify(res.body)).not.toMatch(/argon2/);
  });

  it('refuses a taken e-mail with 409 and bad fields with 400 naming each', async () => {
    const dup = await asAdmin(request(t.app).post('/api/users')).send({ email: 'boss@test.example', name: 'X', role: 'admin', password: 'long-enough-pw' });
    expect(dup.status).toBe(409);
    const bad = await asAdmin(request(t.app).post('/api/users')).send({ email: 'not-an-email', name: '', role: 'wizard', password: 'short' });
    expect(bad.status).toBe(400);
    const fields = bad.body.error.details.map((d: { field: string }) => d.field).sort();
    expect(fields).toEqual(['email', 'name', 'password', 'role']);
  });

  it('changes a role, audits before and after, and the new role applies at once', async () => {
    const user = await t.addUser('designer');
    expect((await request(t.app).get('/api/users').set('Authorization', `Bearer ${user.token}`)).status).toBe(403);
    const res = await asAdmin(request(t.app).patch(`/api/users/${user.id}`)).send({ role: 'admin' });
    expect(res.status).toBe(200);
    expect(res.body.role).toBe('admin');
    expect((await request(t.app).get('/api/users').set('Authorization', `Bearer ${user.token}`)).status).toBe(200);
    const [entry] = await t.sequelize.query<{ before: { role: string }; after: { role: string } }>(
      "SELECT before, after FROM audit_entries WHERE action = 'user.update' AND entity_id = :id",
      { replacements: { id: String(user.id) }, type: QueryTypes.SELECT },
    );
    expect([entry.before.role, entry.after.role]).toEqual(['designer', 'admin']);
  });

  it('does not let an admin lock themself out', async () => {
    const res = await asAdmin(request(t.app).patch(`/api/users/${admin.id}`)).send({ active: false });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('active');
  });

  it('answers 404 for an unknown user and 400 for a bad id or an empty change', async () => {
    expect((await asAdmin(request(t.app).patch('/api/users/999999')).send({ name: 'X' })).status).toBe(404);
    expect((await asAdmin(request(t.app).patch('/api/users/abc')).send({ name: 'X' })).status).toBe(400);
    expect((await asAdmin(request(t.app).patch(`/api/users/${admin.id}`)).send({})).status).toBe(400);
    expect((await asAdmin(request(t.app).patch(`/api/users/${admin.id}`)).send({ password: 'x' })).status).toBe(400);
  });
});
