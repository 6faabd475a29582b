import { describe, expect, it } from 'vitest';
import { ENGINE_VERSION } from './version';

describe('engine version', () => {
  it('is a semantic version that stored estimates can record', () => {
    expect(ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
  });
});
