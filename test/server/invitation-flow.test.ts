/**
 * Invitations and password resets end to end: an admin sends a link, the e-mail arrives at this
 * file's fake SMTP server, the link sets a password once, and it stops working when used,
 * replaced or expired. Every send is audited; a stopped mail server gives 503 mail_unavailable.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { startFakeSmtpServer } from '../../server/mail/fake-smtp-server.js';
import { hashLinkToken, issueUserToken } from '../../server/services/users/user-tokens.js';
import type { ReceivedMessage } from '../../server/mail/fake-smtp-server.js';
import { startTestApp, TEST_PASSWORD, type TestApp } from '../support/test-app.js';

const PUBLIC_URL = 'https://shelfmatch.tarnwick.example';
const HOUR_MS = 3_600_000;

let t: TestApp;
let admin: { id: number; token: string; email: string };
beforeAll(async () => {
  t = await startTestApp({ PUBLIC_URL: `${PUBLIC_URL}/` });
  admin = await t.addUser('admin', 'ada.okafor@tarnwick.example');
});
afterAll(async () => {
  await t?.close();
});

const asAdmin = (r: request.Test) => r.set('Authorization', `Bearer ${admin.token}`);
const sendLink = (id: number | string, kind: 'invitation' | 'password-reset', app = t.app) => asAdmin(request(app).post(`/api/users/${id}/${kind}`)).send({});
const setPassword = (token: string, password: string) => request(t.app).post('/api/auth/set-password').send({ token, password });
const signIn = (email: string, password: string) => request(t.app).post('/api/auth/login').send({ email, password });

/** The link in a received message's plain body, and the token in it. */
function linkIn(message: ReceivedMessage): { link: string; token: string } {
  const match = message.text?.match(/https:\/\/\S+\/set-password\?token=(\S+)/);
  if (!match) throw new Error(`no set-password link in: ${message.text}`);
  return { link: match[0], token: decodeURIComponent(match[1]) };
}
const lastMessageTo = (email: string) => t.mail.messagesTo(email).at(-1)!;

interface TokenRow {
  token_hash: string;
  purpose: string;
  expires_at: Date;
  used_at: Date | null;
  revoked_at: Date | null;
  created_by: number | null;
}
const tokenRows = (userId: number) =>
  t.sequelize.query<TokenRow>('SELECT * FROM user_tokens WHERE user_id = :userId ORDER BY id', { replacements: { userId }, type: QueryTypes.SELECT });
const auditOf = (userId: number, action: string) =>
  t.sequelize.query<{ actor_id: number; after: Record<string, unknown> }>(
    "SELECT actor_id, after FROM audit_entries WHERE entity_type = 'user' AND entity_id = :id AND action = :action ORDER BY id",
    { replacements: { id: String(userId), action }, type: QueryTypes.SELECT },
  );

describe('invitation', () => {
  it('e-mails a link that sets the password once; the user then signs in with it', async () => {
    const invitee = await t.addUser('designer', 'bruno.lindqvist@tarnwick.example');
    const before = Date.now();
    const res = await sendLink(invitee.id, 'invitation');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ userId: invitee.id, email: 'bruno.lindqvist@tarnwick.example', purpose: 'invitation' });
    // Default lifetime of an invitation: 7 days.
    const expiresAt = Date.parse(res.body.expiresAt);
    expect(expiresAt).toBeGreaterThanOrEqual(before + 7 * 24 * HOUR_MS);
    expect(expiresAt).toBeLessThanOrEqual(Date.now() + 7 * 24 * HOUR_MS);

    const message = lastMessageTo('bruno.lindqvist@tarnwick.example');
    expect(message.subject).toBe('You are invited to Shelfmatch');
    expect(message.text).toContain('ada.okafor@tarnwick.example');
    expect(message.text).toContain('designer role');
    const { link, token } = linkIn(message);
    expect(link.startsWith(`${PUBLIC_URL}/set-password?token=`)).toBe(true);
    expect(message.html).toContain(`href="${link}"`);

    // Only the SHA-256 of the token is kept.
    const [row] = await tokenRows(invitee.id);
    expect(row.token_hash).toBe(hashLinkToken(token));
    expect(row.token_hash).not.toContain(token);
    expect(row.created_by).toBe(admin.id);
    expect(JSON.stringify(await t.sequelize.query('SELECT * FROM user_tokens', { type: QueryTypes.SELECT }))).not.toContain(token);
    // The Outbox keeps the message, but not the token: reading the Outbox must not open accounts.
    const stored = await asAdmin(request(t.app).get(`/api/outbox/${res.body.outboxId}`));
    expect(stored.body.subject).toBe('You are invited to Shelfmatch');
    expect(stored.body.text).toContain(`${PUBLIC_URL}/set-password?token=[hidden]`);
    expect(JSON.stringify(await t.sequelize.query('SELECT * FROM outbound_mail', { type: QueryTypes.SELECT }))).not.toContain(token);

    const check = await request(t.app).post('/api/auth/set-password/check').send({ token });
    expect(check.status).toBe(200);
    expect(check.body).toEqual({ email: 'bruno.lindqvist@tarnwick.example', name: expect.any(String), purpose: 'invitation', expiresAt: res.body.expiresAt });

    const set = await setPassword(token, 'smith-chart-868');
    expect(set.status).toBe(200);
    expect(set.body).toEqual({ email: 'bruno.lindqvist@tarnwick.example' });
    expect((await signIn('bruno.lindqvist@tarnwick.example', 'smith-chart-868')).status).toBe(200);
    expect((await signIn('bruno.lindqvist@tarnwick.example', TEST_PASSWORD)).status).toBe(401);

    const again = await setPassword(token, 'another-password-1');
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('token_used');
    expect((await signIn('bruno.lindqvist@tarnwick.example', 'another-password-1')).status).toBe(401);
    expect((await request(t.app).post('/api/auth/set-password/check').send({ token })).body.error.code).toBe('token_used');

    const [sent] = await auditOf(invitee.id, 'user.invite');
    expect(sent.actor_id).toBe(admin.id);
    expect(sent.after).toMatchObject({ email: 'bruno.lindqvist@tarnwick.example', mailStatus: 'sent', outboxId: res.body.outboxId });
    const [used] = await auditOf(invitee.id, 'user.set_password');
    expect(used.actor_id).toBe(invitee.id);
    expect(used.after).toMatchObject({ purpose: 'invitation' });
  });

  it('invites a user created without a password, who cannot sign in until they set one', async () => {
    const created = await asAdmin(request(t.app).post('/api/users')).send({ email: 'chiara.moss@tarnwick.example', name: 'Chiara Moss', role: 'stores' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const [stored] = await t.sequelize.query<{ password_hash: string | null }>('SELECT password_hash FROM users WHERE id = :id', {
      replacements: { id: created.body.id },
      type: QueryTypes.SELECT,
    });
    expect(stored.password_hash).toBeNull();
    expect(created.body.passwordSet).toBe(false);
    // No password: every sign-in gets the same 401 as a wrong password (no hint the account exists).
    for (const password of ['', 'anything-at-all-1', TEST_PASSWORD]) {
      const res = await signIn('chiara.moss@tarnwick.example', password);
      expect(res.status).toBe(password === '' ? 400 : 401);
    }
    expect((await sendLink(created.body.id, 'invitation')).status).toBe(201);
    const { token } = linkIn(lastMessageTo('chiara.moss@tarnwick.example'));
    expect((await setPassword(token, 'shelf-count-2026')).status).toBe(200);
    const signedIn = await signIn('chiara.moss@tarnwick.example', 'shelf-count-2026');
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.user).toMatchObject({ email: 'chiara.moss@tarnwick.example', role: 'stores', passwordSet: true });
    const listed = await asAdmin(request(t.app).get('/api/users'));
    expect(listed.body.items.find((u: { email: string }) => u.email === 'chiara.moss@tarnwick.example').passwordSet).toBe(true);
    // A short first password is still refused when one is given.
    const short = await asAdmin(request(t.app).post('/api/users')).send({ email: 'x@tarnwick.example', name: 'X', role: 'stores', password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details.map((d: { field: string }) => d.field)).toEqual(['password']);
  });

  it('lets only one of two simultaneous uses of a link succeed', async () => {
    const invitee = await t.addUser('stores');
    await sendLink(invitee.id, 'invitation').expect(201);
    const { token } = linkIn(lastMessageTo(invitee.email));
    const answers = await Promise.all([setPassword(token, 'first-racer-pw'), setPassword(token, 'second-racer-pw')]);
    expect(answers.map((a) => a.status).sort()).toEqual([200, 410]);
    const winner = answers[0].status === 200 ? 'first-racer-pw' : 'second-racer-pw';
    expect((await signIn(invitee.email, winner)).status).toBe(200);
  });

  it('refuses an expired link (made through the service with a past expiry) with 410', async () => {
    const invitee = await t.addUser('purchasing');
    const { token } = await issueUserToken({ userId: invitee.id, purpose: 'invitation', expiresAt: new Date(Date.now() - 60_000), createdBy: admin.id });
    const res = await setPassword(token, 'too-late-password');
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('token_expired');
    expect(res.body.error.message).toMatch(/expired at \d{4}-\d\d-\d\dT/);
    expect((await signIn(invitee.email, 'too-late-password')).status).toBe(401);
    expect((await signIn(invitee.email, TEST_PASSWORD)).status).toBe(200);
  });

  it('honours INVITATION_TTL_HOURS', async () => {
    const invitee = await t.addUser('designer');
    const before = Date.now();
    const res = await sendLink(invitee.id, 'invitation', t.appWith({ INVITATION_TTL_HOURS: '2' }).app);
    expect(res.status).toBe(201);
    const expiresAt = Date.parse(res.body.expiresAt);
    expect(expiresAt).toBeGreaterThanOrEqual(before + 2 * HOUR_MS);
    expect(expiresAt).toBeLessThanOrEqual(Date.now() + 2 * HOUR_MS);
  });

  it('answers 404 for an unknown user, 400 for a bad id or a body, 409 for a deactivated user', async () => {
    expect((await sendLink(999999, 'invitation')).status).toBe(404);
    const badId = await sendLink('abc', 'invitation');
    expect(badId.status).toBe(400);
    expect(badId.body.error.details).toEqual([{ field: 'id', message: 'not a positive whole number' }]);
    const user = await t.addUser('stores');
    const withBody = await asAdmin(request(t.app).post(`/api/users/${user.id}/invitation`)).send({ email: 'other@example.com' });
    expect(withBody.status).toBe(400);
    await t.sequelize.query('UPDATE users SET active = false WHERE id = :id', { replacements: { id: user.id } });
    const deactivated = await sendLink(user.id, 'invitation');
    expect(deactivated.status).toBe(409);
    expect(t.mail.messagesTo(user.email)).toEqual([]);
  });
});

describe('password reset', () => {
  it('sends a one-hour link; the old password works until the new one is set', async () => {
    const user = await t.addUser('purchasing', 'dana.whitcombe@tarnwick.example');
    const before = Date.now();
    const res = await sendLink(user.id, 'password-reset');
    expect(res.status).toBe(201);
    // Default lifetime of a reset: 1 hour.
    expect(Date.parse(res.body.expiresAt)).toBeGreaterThanOrEqual(before + HOUR_MS);
    expect(Date.parse(res.body.expiresAt)).toBeLessThanOrEqual(Date.now() + HOUR_MS);
    const message = lastMessageTo('dana.whitcombe@tarnwick.example');
    expect(message.subject).toBe('Set a new Shelfmatch password');
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(200);

    const { token } = linkIn(message);
    expect((await setPassword(token, 'new-reset-password')).status).toBe(200);
    expect((await signIn(user.email, 'new-reset-password')).status).toBe(200);
    expect((await signIn(user.email, TEST_PASSWORD)).status).toBe(401);
    const [audit] = await auditOf(user.id, 'user.password_reset');
    expect(audit).toMatchObject({ actor_id: admin.id, after: { mailStatus: 'sent' } });
  });

  it('honours PASSWORD_RESET_TTL_MINUTES', async () => {
    const user = await t.addUser('stores');
    const before = Date.now();
    const res = await sendLink(user.id, 'password-reset', t.appWith({ PASSWORD_RESET_TTL_MINUTES: '15' }).app);
    expect(Date.parse(res.body.expiresAt)).toBeGreaterThanOrEqual(before + 15 * 60_000);
    expect(Date.parse(res.body.expiresAt)).toBeLessThanOrEqual(Date.now() + 15 * 60_000);
  });

  it('a newer link replaces an older one, and setting a password revokes every other open link', async () => {
    const user = await t.addUser('designer');
    await sendLink(user.id, 'password-reset').expect(201);
    const older = linkIn(lastMessageTo(user.email)).token;
    await sendLink(user.id, 'password-reset').expect(201);
    const newer = linkIn(lastMessageTo(user.email)).token;
    expect(newer).not.toBe(older);
    const replaced = await setPassword(older, 'from-the-old-link');
    expect(replaced.status).toBe(410);
    expect(replaced.body.error.code).toBe('token_replaced');

    await sendLink(user.id, 'invitation').expect(201);
    const invitation = linkIn(lastMessageTo(user.email)).token;
    expect((await setPassword(newer, 'from-the-newer-link')).status).toBe(200);
    const afterUse = await setPassword(invitation, 'from-the-invitation');
    expect(afterUse.status).toBe(410);
    expect(afterUse.body.error.code).toBe('token_replaced');
    expect((await signIn(user.email, 'from-the-newer-link')).status).toBe(200);
  });
});

describe('set-password input', () => {
  it('answers 400 with details for a missing, malformed or unknown token and a short password', async () => {
    const empty = await request(t.app).post('/api/auth/set-password').send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.details.map((d: { field: string }) => d.field).sort()).toEqual(['password', 'token']);
    const short = await setPassword('A'.repeat(43), 'short');
    expect(short.status).toBe(400);
    expect(short.body.error.details).toEqual([{ field: 'password', message: 'a password needs at least 10 characters' }]);
    const unknown = await setPassword('A'.repeat(43), 'long-enough-password');
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.code).toBe('token_invalid');
    expect(unknown.body.error.details).toEqual([{ field: 'token', message: 'unknown or malformed' }]);
    const malformed = await request(t.app).post('/api/auth/set-password/check').send({ token: 'not a token!' });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.code).toBe('token_invalid');
  });

  it('refuses the link of a user who was deactivated after it was sent', async () => {
    const user = await t.addUser('stores');
    await sendLink(user.id, 'invitation').expect(201);
    const { token } = linkIn(lastMessageTo(user.email));
    await t.sequelize.query('UPDATE users SET active = false WHERE id = :id', { replacements: { id: user.id } });
    const res = await setPassword(token, 'deactivated-pw-1');
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('account_deactivated');
  });
});

describe('with the mail server down', () => {
  it('answers 503 mail_unavailable, marks the Outbox entry failed, and the link never works', async () => {
    const server = await startFakeSmtpServer({ port: 0 });
    const app = t.appWith({ SMTP_PORT: String(server.port) }).app;
    const user = await t.addUser('designer');
    expect((await sendLink(user.id, 'password-reset', app)).status).toBe(201);
    await server.close();

    const res = await sendLink(user.id, 'password-reset', app);
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('mail_unavailable');
    expect(res.body.error.message).toContain(`127.0.0.1:${server.port}`);
    const outboxId = res.body.error.details.find((d: { field: string }) => d.field === 'outboxId').value;
    const outbox = await asAdmin(request(t.app).get(`/api/outbox/${outboxId}`));
    expect(outbox.body).toMatchObject({ status: 'failed', to: [user.email], subject: 'Set a new Shelfmatch password' });

    const rows = await tokenRows(user.id);
    expect(rows).toHaveLength(2);
    expect(rows[1].revoked_at).toBeInstanceOf(Date);
    // The earlier link, sent while the server was up, still works: the failed send did not replace it.
    expect(rows[0].revoked_at).toBeNull();
    const [, failedAudit] = await auditOf(user.id, 'user.password_reset');
    expect(failedAudit.after).toMatchObject({ mailStatus: 'failed', outboxId });
  });
});
