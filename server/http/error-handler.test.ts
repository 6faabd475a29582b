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

  it('answers a write refused by a unique rule (either database) with 409, not 500', async () => {
    for (const code of ['23505', 'SQLITE_CONSTRAINT_UNIQUE']) {
      const res = await request(failingWith(Object.assign(new Error('duplicate'), { code }))).get('/x');
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
    }
  });
});
