import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionAnswerSchema } from '../../shared/schemas/auth.schema';
import { Client, createTestApp, type TestApp } from '../setup/test-app';
import { makeOrgWithUser, TEST_PASSWORD } from '../setup/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ LOGIN_RATE_LIMIT: '100' });
});
afterAll(async () => t.close());

describe('asking who is signed in', () => {
  it('answers 200 with no session when nobody is signed in, and with the person once they are', async () => {
    const c = new Client(t.app);
    const before = await c.get('/api/auth/session');
    expect(before.status).toBe(200);
    expect(sessionAnswerSchema.parse(before.body)).toEqual({ session: null });

    const u = await makeOrgWithUser(t.db, 'merchant', 'merchant_sales');
    expect((await c.login(u.email, TEST_PASSWORD)).status).toBe(200);
    const during = sessionAnswerSchema.parse((await c.get('/api/auth/session')).body);
    expect(during.session?.user.email).toBe(u.email);
    expect(during.session?.organisation.kind).toBe('merchant');

    expect((await c.post('/api/auth/logout')).status).toBe(204);
    expect((await c.get('/api/auth/session')).body).toEqual({ session: null });
  });
});
