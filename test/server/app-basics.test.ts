import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startTestApp, type TestApp } from '../support/test-app.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

describe('the API shell', () => {
  it('reports health with the database state', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: 'up', solves: { threadsPerLane: expect.any(Number), single: { running: 0, queued: 0 }, combinations: { running: 0, queued: 0 } } });
  });

  it('sends helmet headers, including a same-origin content security policy', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('answers an unknown API route with the JSON error shape and 404', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.stringContaining('/api/no-such-thing') } });
  });

  it('answers malformed JSON with 400 invalid_json', async () => {
    const res = await request(t.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });

  it('answers a body over 1 MB with 413', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'a@b.c', password: 'x'.repeat(1_100_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });
});
