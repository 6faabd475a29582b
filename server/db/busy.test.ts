import { execFile } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { createDb } from './knex';

const run = promisify(execFile);
const worker = join(import.meta.dirname, '../../tests/setup/sqlite-bump-worker.ts');

describe('SQLite shared by two server processes', () => {
  it('lets read-then-write transactions from both wait their turn: none fails as locked, none is lost', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'ridgeload-busy-')), 'shared.sqlite');
    const db = createDb(file);
    await db.schema.createTable('counter', (t) => {
      t.integer('id').primary();
      t.integer('n').notNullable();
    });
    await db('counter').insert({ id: 1, n: 0 });
    const servers = await Promise.all([1, 2].map(() => run(process.execPath, ['--import', 'tsx', worker, file, '60'], { encoding: 'utf8', timeout: 60_000 })));
    const failures = servers.map((s) => (JSON.parse(s.stdout.trim().split('\n').pop()!) as { failed: number }).failed);
    expect({ failures, errors: servers.map((s) => s.stderr.trim()).filter(Boolean) }).toEqual({ failures: [0, 0], errors: [] });
    expect((await db('counter').where({ id: 1 }).first()).n).toBe(120);
    await db.destroy();
  }, 90_000);
});
