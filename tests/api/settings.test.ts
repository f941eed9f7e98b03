// GET /api/settings sends the configured values the screens must agree with: a changed setting on the
// server reaches the client (nothing of it is hard-coded there).
import { describe, it, expect, afterAll } from 'vitest';
import request from 'supertest';
import { makeTestApp, createUser, agentFor, type TestApp } from './helpers';
import { clientSettingsSchema } from '../../shared/api/settings';

const apps: TestApp[] = [];
afterAll(async () => {
  for (const a of apps) await a.close();
});

describe('GET /api/settings', () => {
  it('answers 401 without a session', async () => {
    const t = await makeTestApp();
    apps.push(t);
    const res = await request(t.app).get('/api/settings');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('sends the configured inversion threshold and upload limit, in the shared schema', async () => {
    const t = await makeTestApp({ INVERSION_THRESHOLD: '0.025', UPLOAD_MAX_BYTES: '1234567' });
    apps.push(t);
    await createUser('settings-reader@example.test');
    const { agent } = await agentFor(t.app, 'settings-reader@example.test');
    const res = await agent.get('/api/settings');
    expect(res.status).toBe(200);
    const body = clientSettingsSchema.parse(res.body);
    expect(body).toEqual({ inversionThreshold: 0.025, uploadMaxBytes: 1234567 });
  });
});
