import { lazy, Suspense, useCallback, useDeferredValue, useId, useMemo, useRef, useState } from 'react';
import type { DragEvent } from 'react';
import type { ScheduleResponse } from '../../../../shared/schemas/schedule-upload.schema';
import { ErrorAlert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { SkeletonBlock } from '../../../components/ui/skeleton';
import { isApiError } from '../../../lib/api-client';
import { useUploadSchedule } from '../api/save-schedule';
import { checkGrid, gridToCsv, headerIndex } from '../lib/csv-grid';
import type { CsvGrid, GridCheck, LocatedProblem } from '../lib/csv-grid';

// The preview's grid (with the table library) is only shown once a file is read, so it loads then (DEVELOPERS.md, decision 37).
const SchedulePreview = lazy(() => import('./schedule-preview').then((m) => ({ default: m.SchedulePreview })));
import { fileProblem, readScheduleFile } from '../lib/read-schedule-file';

export const EXAMPLE_SCHEDULE_URL = '/api/examples/roof-schedule.csv';

interface Loaded {
  name: string;
  grid: CsvGrid;
  /** The check that came with the file, reused until the first edit. */
  first: { grid: CsvGrid; check: GridCheck };
}

function Progress({ name, fraction }: { name: string; fraction: number }) {
  const percent = Math.round(fraction * 100);
  return (
    <div className="space-y-2">
      <p className="font-medium">Reading {name}…</p>
      <div role="progressbar" aria-label={`Reading ${name}`} aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} className="h-3 w-full overflow-hidden rounded-full bg-ink-100">
        <div className="h-full rounded-full bg-clay-600 transition-[width]" style={{ width: `${percent}%` }} />
      </div>
      <p className="text-sm text-ink-600">{percent} %</p>
    </div>
  );
}

/** Puts the server's answer about face n back on the spreadsheet row and column it came from. */
/** The server reads the same sheet, so its spreadsheet row numbers are the grid's own. */
export function serverProblemsOnGrid(details: readonly { row?: number; column?: string; message: string }[], grid: CsvGrid): LocatedProblem[] {
  const index = headerIndex(grid.rows[0] ?? []);
  return details.map((d) => {
    const row = d.row !== undefined && d.row <= grid.rows.length ? d.row : null;
    const column = d.column !== undefined ? (index.get(d.column) ?? null) : null;
    return { row, column, columnName: d.column ?? null, message: d.message };
  });
}

function downloadText(text: string, filename: string) {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv;charset=utf-8' }));
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  document.body.appendChild(link);
  link.click();
  link.remove();
  window.setTimeout(() => URL.revokeObjectURL(url), 1000);
}

interface ScheduleImportProps {
  projectId: number;
  onImported: (schedule: ScheduleResponse) => void;
}

/**
 * Importing a schedule: pick or drop a CSV, see it as a sheet with every rejected cell marked,
 * fix cells in place (each edit is checked again), then store it as the site's next version.
 */
export function ScheduleImport({ projectId, onImported }: ScheduleImportProps) {
  const inputId = useId();
  const inputRef = useRef<HTMLInputElement>(null);
  const [dragging, setDragging] = useState(false);
  const [reading, setReading] = useState<{ name: string; fraction: number } | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [loaded, setLoaded] = useState<Loaded | null>(null);
  const [serverProblems, setServerProblems] = useState<LocatedProblem[] | null>(null);
  const save = useUploadSchedule(projectId);

  const grid = loaded?.grid ?? null;
  const deferredGrid = useDeferredValue(grid);
  const check = useMemo<GridCheck | null>(() => {
    if (!deferredGrid || !loaded) return null;
    return loaded.first.grid === deferredGrid ? loaded.first.check : checkGrid(deferredGrid);
  }, [deferredGrid, loaded]);
  const checking = grid !== deferredGrid;
  const shownCheck = useMemo<GridCheck | null>(() => {
    if (!check) return null;
    if (!serverProblems) return check;
    return { ...check, ok: false, problems: [...check.problems, ...serverProblems] };
  }, [check, serverProblems]);

  async function take(file: File) {
    setReadError(null);
    setServerProblems(null);
    save.reset();
    const problem = fileProblem(file);
    if (problem) {
      setReadError(problem);
      return;
    }
    setLoaded(null);
    setReading({ name: file.name, fraction: 0 });
    try {
      const read = await readScheduleFile(file, (fraction) => setReading({ name: file.name, fraction }));
      setLoaded({ name: file.name, grid: read.grid, first: read });
    } catch (error) {
      setReadError(error instanceof Error ? error.message : 'The file could not be read.');
    } finally {
      setReading(null);
    }
  }

  const onCellChange = useCallback((row: number, column: number, value: string) => {
    setServerProblems(null);
    setLoaded((current) => {
      if (!current) return current;
      const rows = current.grid.rows.slice();
      const cells = (rows[row - 1] ?? []).slice();
      while (cells.length <= column) cells.push('');
      cells[column] = value;
      rows[row - 1] = cells;
      return { ...current, grid: { ...current.grid, rows } };
    });
  }, []);

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    const file = event.dataTransfer.files[0];
    if (file) void take(file);
  }

  function upload() {
    if (!check?.ok || !grid || !loaded) return;
    save.mutate(
      { csv: gridToCsv(grid), filename: loaded.name },
      {
        onSuccess: (schedule) => onImported(schedule),
        onError: (error) => {
          if (isApiError(error) && error.code === 'invalid_schedule') setServerProblems(serverProblemsOnGrid(error.details, grid));
        },
      },
    );
  }

  return (
    <div className="space-y-6">
      <Card title="Choose the schedule file">
        <div
          onDragOver={(event) => {
            event.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={`rounded-lg border-2 border-dashed px-4 py-8 text-center transition-colors ${dragging ? 'border-clay-600 bg-clay-50' : 'border-ink-300 bg-mortar-50'}`}
        >
          <p className="text-lg font-semibold">Drop a CSV file here</p>
          <p className="mt-1 text-ink-600">or</p>
          <label htmlFor={inputId} className={buttonClasses('primary', 'md', 'mt-2 cursor-pointer has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-clay-700')}>
            Choose a CSV file
            <input
              id={inputId}
              ref={inputRef}
              type="file"
              accept=".csv,text/csv,text/plain"
              className="sr-only"
              onChange={(event) => {
                const file = event.target.files?.[0];
                if (file) void take(file);
                event.target.value = '';
              }}
            />
          </label>
          <p className="mt-3 text-sm text-ink-600">One row per roof face, lengths in millimetres. Save from the spreadsheet as “CSV UTF-8”; comma, semicolon or tab separated.</p>
        </div>
        {reading ? (
          <div className="mt-4">
            <Progress name={reading.name} fraction={reading.fraction} />
          </div>
        ) : null}
        {readError ? <ErrorAlert className="mt-4" error={new Error(readError)} title="That file cannot be used" /> : null}
      </Card>

      {loaded && grid && shownCheck ? (
        <Card
          title={`Preview of ${loaded.name}`}
          actions={
            <div className="flex flex-wrap gap-2">
              <Button variant="secondary" onClick={() => downloadText(gridToCsv(grid), loaded.name.replace(/(\.csv)?$/i, '-checked.csv'))}>
                Download this version
              </Button>
              <Button variant="ghost" onClick={() => inputRef.current?.click()}>
                Choose another file
              </Button>
            </div>
          }
        >
          <Suspense fallback={<SkeletonBlock label="Loading the preview" lines={6} />}>
            <SchedulePreview grid={grid} check={shownCheck} checking={checking} onCellChange={onCellChange} />
          </Suspense>
          <div className="mt-6 flex flex-wrap items-center gap-3 border-t border-mortar-200 pt-4">
            <Button size="lg" busy={save.isPending} disabled={!shownCheck.ok || checking} onClick={upload}>
              {shownCheck.ok ? `Import ${shownCheck.faces.length} ${shownCheck.faces.length === 1 ? 'face' : 'faces'}` : 'Fix the marked cells to import'}
            </Button>
            <p className="text-sm text-ink-600">The server checks the faces again and stores all of them as a new version, or none.</p>
          </div>
          {save.isError && !(isApiError(save.error) && save.error.code === 'invalid_schedule') ? <ErrorAlert className="mt-4" error={save.error} title="The schedule was not stored" /> : null}
          {serverProblems ? <ErrorAlert className="mt-4" error={save.error} title="The server refused the schedule; the cells it named are marked above" /> : null}
        </Card>
      ) : null}
    </div>
  );
}
