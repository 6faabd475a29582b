import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, gzipSync } from 'node:zlib';
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { clientAssets } from '../../server/http/client-assets';

function builtClient() {
  const dir = mkdtempSync(join(tmpdir(), 'ridgeload-client-'));
  mkdirSync(join(dir, 'assets'));
  const script = 'console.log("ridgeload");'.repeat(200);
  writeFileSync(join(dir, 'assets', 'index-CGA4T4oR.js'), script);
  writeFileSync(join(dir, 'assets', 'index-CGA4T4oR.js.br'), brotliCompressSync(script));
  writeFileSync(join(dir, 'assets', 'index-CGA4T4oR.js.gz'), gzipSync(script));
  writeFileSync(join(dir, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  const app = express();
  app.use(clientAssets(dir));
  return { app, script };
}

describe('the built client is served compressed and cached by its hash', () => {
  it('sends the brotli copy to a browser that accepts it, marked immutable for a year', async () => {
    const { app, script } = builtClient();
    const res = await request(app).get('/assets/index-CGA4T4oR.js').set('Accept-Encoding', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(Number(res.headers['content-length'])).toBeLessThan(script.length / 10);
  });

  it('sends gzip where brotli is not accepted, and the plain file where neither is', async () => {
    const { app, script } = builtClient();
    const gz = await request(app).get('/assets/index-CGA4T4oR.js').set('Accept-Encoding', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    const plain = await request(app).get('/assets/index-CGA4T4oR.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text).toBe(script);
  });

  it('has files without a hash revalidated on every visit', async () => {
    const { app } = builtClient();
    const res = await request(app).get('/favicon.svg');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('no-cache');
  });
});
