import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './env';

const dir = () => mkdtempSync(join(tmpdir(), 'ridgeload-config-'));

describe('configuration', () => {
  it('keeps the firm calendar in Europe/London unless told otherwise', () => {
    expect(loadConfig({ DATA_DIR: dir() }).calendar.timeZone).toBe('Europe/London');
    expect(loadConfig({ DATA_DIR: dir(), BUSINESS_TIME_ZONE: 'Europe/Dublin' }).calendar.timeZone).toBe('Europe/Dublin');
  });

  it('refuses to start with an unknown BUSINESS_TIME_ZONE, naming the variable', () => {
    expect(() => loadConfig({ DATA_DIR: dir(), BUSINESS_TIME_ZONE: 'Europe/Atlantis' })).toThrow(ConfigError);
    expect(() => loadConfig({ DATA_DIR: dir(), BUSINESS_TIME_ZONE: 'Europe/Atlantis' })).toThrow(/BUSINESS_TIME_ZONE/);
  });

  it('selects PostgreSQL with DATABASE_URL, and then requires SESSION_SECRET', () => {
    expect(() => loadConfig({ DATA_DIR: dir(), DATABASE_URL: 'postgres://app@127.0.0.1:5432/ridgeload' })).toThrow(/SESSION_SECRET: required with DATABASE_URL/);
    const config = loadConfig({ DATA_DIR: dir(), DATABASE_URL: 'postgres://app@127.0.0.1:5432/ridgeload', SESSION_SECRET: 'x'.repeat(40) });
    expect(config.database).toBe('postgres://app@127.0.0.1:5432/ridgeload');
    expect(loadConfig({ DATA_DIR: dir() }).database).toMatch(/ridgeload\.sqlite$/);
    expect(() => loadConfig({ DATA_DIR: dir(), DATABASE_URL: 'mysql://x@y/z' })).toThrow(/DATABASE_URL/);
  });
});
