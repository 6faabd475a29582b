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
});
