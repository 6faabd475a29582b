import { MAX_SCHEDULE_BYTES } from '../../../../shared/schemas/schedule-upload.schema';
import { checkGrid, gridFromText } from './csv-grid';
import type { CsvGrid, GridCheck } from './csv-grid';
import type { WorkerAnswer } from './schedule-file-messages';

/** Above this size the file is read in a worker, so the page stays responsive and shows progress. */
export const WORKER_THRESHOLD_BYTES = 256 * 1024;

export interface ReadSchedule {
  grid: CsvGrid;
  check: GridCheck;
}

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** Why a file cannot be a schedule before reading it, or null. */
export function fileProblem(file: File): string | null {
  if (file.size > MAX_SCHEDULE_BYTES) {
    return `${file.name} is ${megabytes(file.size)}; the largest schedule accepted is ${megabytes(MAX_SCHEDULE_BYTES)}. Split the job into several sites.`;
  }
  if (file.size === 0) return `${file.name} is empty.`;
  if (!/\.(csv|txt|tsv)$/i.test(file.name) && !/^text\//.test(file.type) && file.type !== 'application/vnd.ms-excel') {
    return `${file.name} does not look like a CSV file. Save the schedule from the spreadsheet as “CSV UTF-8” and choose that file.`;
  }
  return null;
}

function readInWorker(file: File, onProgress: (fraction: number) => void): Promise<ReadSchedule> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(new URL('./parse-schedule.worker.ts', import.meta.url), { type: 'module' });
    worker.addEventListener('message', (event: MessageEvent<WorkerAnswer>) => {
      const answer = event.data;
      if (answer.type === 'progress') onProgress(answer.fraction);
      else {
        worker.terminate();
        if (answer.type === 'done') resolve({ grid: answer.grid, check: answer.check });
        else reject(new Error(answer.message));
      }
    });
    worker.addEventListener('error', (event) => {
      worker.terminate();
      reject(new Error(`The file could not be read: ${event.message || 'the reader stopped'}`));
    });
    worker.postMessage({ file });
  });
}

/**
 * Reads a chosen schedule file into a checked grid: small files at once on the page, large ones in
 * a worker with progress. UTF-8 is assumed, as the server requires.
 */
export async function readScheduleFile(file: File, onProgress: (fraction: number) => void = () => {}): Promise<ReadSchedule> {
  if (file.size > WORKER_THRESHOLD_BYTES && typeof Worker !== 'undefined') return readInWorker(file, onProgress);
  const grid = gridFromText(await file.text());
  onProgress(1);
  return { grid, check: checkGrid(grid) };
}
