import type { CsvGrid, GridCheck } from './csv-grid';

/** What the page sends the schedule worker, and what it answers. */
export interface WorkerRequest {
  file: File;
}

export type WorkerAnswer = { type: 'progress'; fraction: number } | { type: 'done'; grid: CsvGrid; check: GridCheck } | { type: 'failed'; message: string };
