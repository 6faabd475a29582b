import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { transformSync } from 'esbuild';
import { afterAll, describe, expect, it } from 'vitest';
import { sourceMappedStack } from './logger';

const dir = mkdtempSync(join(tmpdir(), 'ridgeload-stack-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('logged stacks of the compiled server', () => {
  it('point at the TypeScript source line, read from the bundle’s map beside it', () => {
    const source = ['type Pallet = { kg: number };', '', 'export function load(p: Pallet): number {', '  if (p.kg > 1000) throw new Error("too heavy");', '  return p.kg;', '}', ''].join('\n');
    const out = transformSync(source, { loader: 'ts', format: 'esm', sourcemap: 'external', sourcefile: 'load-plan.ts' });
    const file = join(dir, 'bundle.mjs');
    writeFileSync(file, out.code);
    writeFileSync(`${file}.map`, out.map);
    const line = out.code.split('\n').findIndex((l) => l.includes('throw')) + 1;
    const column = out.code.split('\n')[line - 1].indexOf('throw') + 1;
    const stack = `Error: too heavy\n    at load (${pathToFileURL(file).href}:${line}:${column})\n    at node:internal/main:1:1`;
    const mapped = sourceMappedStack(stack);
    expect(mapped).toMatch(/at load \(.*load-plan\.ts:4:\d+\)/);
    expect(mapped).toContain('at node:internal/main:1:1');
  });

  it('leaves frames of files without a map as they are', () => {
    const stack = `Error: x\n    at f (${pathToFileURL(join(dir, 'no-map.mjs')).href}:3:7)`;
    expect(sourceMappedStack(stack)).toBe(stack);
  });
});
