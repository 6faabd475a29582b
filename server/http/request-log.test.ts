import express from 'express';
import pino from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { requestLog } from './request-log';

function appLoggingAt(level: string) {
  const lines: Record<string, unknown>[] = [];
  const logger = pino({ level }, { write: (line: string) => void lines.push(JSON.parse(line) as Record<string, unknown>) });
  const app = express();
  app.use(requestLog(logger, (url) => url === '/health'));
  app.get('/things', (_req, res) => void res.status(201).json({ ok: true }));
  app.get('/health', (_req, res) => void res.json({ ok: true }));
  return { app, lines };
}

describe('the request log', () => {
  it('writes one line per answered request with its method, address, status and time', async () => {
    const { app, lines } = appLoggingAt('info');
    await request(app).get('/things?page=2');
    await request(app).get('/things');
    await new Promise((r) => setImmediate(r));
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatchObject({ msg: 'request completed', req: { id: 1, method: 'GET', url: '/things?page=2' }, res: { status: 201 } });
    expect(lines[1]).toMatchObject({ req: { id: 2 } });
    expect(typeof lines[0].responseTime).toBe('number');
  });

  it('leaves out the ignored addresses, and writes nothing when info is off', async () => {
    const quiet = appLoggingAt('info');
    await request(quiet.app).get('/health');
    const off = appLoggingAt('warn');
    await request(off.app).get('/things');
    await new Promise((r) => setImmediate(r));
    expect(quiet.lines).toEqual([]);
    expect(off.lines).toEqual([]);
  });
});
