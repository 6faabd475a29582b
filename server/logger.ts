import { readFileSync } from 'node:fs';
import { SourceMap } from 'node:module';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import pino, { type Logger } from 'pino';

/**
 * The server's logger. Errors are logged with their stack in the TypeScript sources' lines.
 *
 * Node's --enable-source-maps decodes the whole bundle's source map when the server starts and
 * keeps it, some 25 MB resident for a map only an error needs. So the compiled server runs without
 * it, and a logged error's stack is mapped here instead: the bundle's map is read on the first
 * error that needs it and kept from then on.
 */
export function createLogger(level: string): Logger {
  return pino({
    level,
    serializers: {
      err: (err: Error) => {
        const out = pino.stdSerializers.err(err);
        if (typeof out.stack === 'string') out.stack = sourceMappedStack(out.stack);
        return out;
      },
    },
  });
}

const maps = new Map<string, SourceMap | null>();

function mapOf(file: string): SourceMap | null {
  let map = maps.get(file);
  if (map === undefined) {
    try {
      map = new SourceMap(JSON.parse(readFileSync(`${file}.map`, 'utf8')) as ConstructorParameters<typeof SourceMap>[0]);
    } catch {
      map = null; // no map beside the file: its own positions stand
    }
    maps.set(file, map);
  }
  return map;
}

/** A stack whose frames in the compiled bundle (file://….mjs:line:column) point at the TypeScript source instead. */
export function sourceMappedStack(stack: string): string {
  if (process.sourceMapsEnabled) return stack; // Node maps them itself
  return stack.replace(/(file:\/\/[^\s()]+?\.mjs):(\d+):(\d+)/g, (frame: string, url: string, line: string, column: string) => {
    const file = fileURLToPath(url);
    const entry = mapOf(file)?.findEntry(Number(line) - 1, Number(column) - 1);
    if (!entry || !('originalSource' in entry) || !entry.originalSource) return frame;
    const source = entry.originalSource.startsWith('file://') ? fileURLToPath(entry.originalSource) : resolve(dirname(file), entry.originalSource);
    return `${source}:${entry.originalLine + 1}:${entry.originalColumn + 1}`;
  });
}
