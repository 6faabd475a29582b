import Papa from 'papaparse';
import { CSV_CHUNK_CHARS, detectDelimiter } from '../../../../shared/engine/schedule-parse';
import { checkGrid, stripBom, trimTrailingBlankRows } from './csv-grid';
import type { WorkerAnswer, WorkerRequest } from './schedule-file-messages';

declare const self: DedicatedWorkerGlobalScope;

function post(message: WorkerAnswer) {
  self.postMessage(message);
}

/**
 * Reads a large schedule file off the main thread: papaparse streams the file in chunks (so the page
 * can show how far it has got), then the shared schedule reader checks the grid.
 */
self.addEventListener('message', (event: MessageEvent<WorkerRequest>) => {
  const { file } = event.data;
  void (async () => {
    try {
      const delimiter = detectDelimiter(stripBom(await file.slice(0, 64 * 1024).text()));
      const rows: string[][] = [];
      Papa.parse<string[]>(file, {
        delimiter,
        header: false,
        skipEmptyLines: false,
        chunkSize: CSV_CHUNK_CHARS,
        chunk: (results) => {
          for (const row of results.data) rows.push(row);
          // The cursor counts characters and the size bytes; close enough for a progress bar.
          post({ type: 'progress', fraction: Math.min(0.95, results.meta.cursor / Math.max(1, file.size)) });
        },
        complete: () => {
          if (rows.length > 0 && rows[0].length > 0) rows[0][0] = stripBom(rows[0][0]);
          const grid = { delimiter, rows: trimTrailingBlankRows(rows) };
          post({ type: 'progress', fraction: 1 });
          post({ type: 'done', grid, check: checkGrid(grid) });
        },
        error: (error) => post({ type: 'failed', message: `The file could not be read: ${error.message}` }),
      });
    } catch (error) {
      post({ type: 'failed', message: `The file could not be read: ${error instanceof Error ? error.message : String(error)}` });
    }
  })();
});
