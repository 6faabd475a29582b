import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { errorHandler } from './error-handler';

function failingWith(err: unknown) {
  const app = express();
  app.get('/x', () => {
    throw err;
  });
  app.use(errorHandler);
  return app;
}

describe('database errors as answers', () => {
  it('answers a database still busy after its wait with 503 and Retry-After, not 500', async () => {
    const res = await request(failingWith(Object.assign(new Error('database is locked'), { code: 'SQLITE_BUSY' }))).get('/x');
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBe('1');
    expect(res.body).toEqual({ error: { code: 'busy', message: 'The server is busy; try again in a moment' } });
  });

  it('answers a PostgreSQL deadlock or serialization failure past its retries, a lock wait ended, and no free connection with 503 and Retry-After', async () => {
    const KnexTimeout = class extends Error {
      name = 'KnexTimeoutError';
    };
    const errors = [...['40P01', '40001', '55P03'].map((code) => Object.assign(new Error('conflict'), { code })), new KnexTimeout('Knex: Timeout acquiring a connection. The pool is probably full.')];
    for (const err of errors) {
      const res = await request(failingWith(err)).get('/x');
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toBe('1');
      expect(res.body.error.code).toBe('busy');
    }
    // Any other database error is still ours: 500.
    expect((await request(failingWith(Object.assign(new Error('syntax'), { code: '42601' }))).get('/x')).status).toBe(500);
  });

  it('answers a write refused by a unique rule (either database) with 409, not 500', async () => {
    for (const code of ['23505', 'SQLITE_CONSTRAINT_UNIQUE']) {
      const res = await request(failingWith(Object.assign(new Error('duplicate'), { code }))).get('/x');
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
    }
  });
});
