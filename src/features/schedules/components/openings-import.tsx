import { useId, useState } from 'react';
import type { ScheduleResponse } from '../../../../shared/schemas/schedule-upload.schema';
import { Alert, ErrorAlert } from '../../../components/ui/alert';
import { isApiError } from '../../../lib/api-client';
import { useUploadOpenings } from '../api/save-schedule';
import { fileProblem } from '../lib/read-schedule-file';

export const EXAMPLE_OPENINGS_URL = '/api/examples/openings.csv';

/**
 * Importing the openings of the site's current faces from a CSV (building, face, kind, width_mm,
 * height_mm, quantity): stored as the next version with the same faces. A refusal lists every
 * problem by spreadsheet row and column, and nothing is stored.
 */
export function OpeningsImport({ projectId, onImported }: { projectId: number; onImported?: (schedule: ScheduleResponse) => void }) {
  const inputId = useId();
  const upload = useUploadOpenings(projectId);
  const [problem, setProblem] = useState<string | null>(null);
  const [stored, setStored] = useState<ScheduleResponse | null>(null);

  const pick = async (file: File | undefined) => {
    setProblem(null);
    setStored(null);
    if (!file) return;
    const bad = fileProblem(file);
    if (bad) {
      setProblem(bad);
      return;
    }
    const csv = await file.text();
    try {
      const schedule = await upload.mutateAsync({ csv, filename: file.name });
      setStored(schedule);
      onImported?.(schedule);
    } catch {
      // Shown from the mutation's error below.
    }
  };

  const rejected = upload.isError && isApiError(upload.error) && upload.error.code === 'invalid_schedule' ? upload.error : null;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <label htmlFor={inputId} className="font-medium">
          Import openings (CSV)
        </label>
        <input
          id={inputId}
          type="file"
          accept=".csv,text/csv"
          disabled={upload.isPending}
          className="min-h-tap text-sm"
          onChange={(event) => {
            void pick(event.target.files?.[0]);
            event.target.value = '';
          }}
        />
        <a href={EXAMPLE_OPENINGS_URL} download className="inline-flex min-h-tap items-center text-sm font-medium text-clay-700 underline underline-offset-2">
          Download the example openings file
        </a>
      </div>
      <p className="text-sm text-ink-600">
        Columns: building, face, kind (roof_window, chimney, dormer or hatch), width_mm across the slope, height_mm up the slope, quantity (1 if blank). The openings replace those of the current version; the faces stay
        as they are.
      </p>
      {problem ? (
        <Alert tone="danger" title="This file cannot be read">
          {problem}
        </Alert>
      ) : null}
      {stored ? (
        <Alert tone="success" title={`Version ${stored.version} stored`}>
          {stored.openings.length} {stored.openings.length === 1 ? 'opening' : 'openings'} in {stored.faces.length} faces.
        </Alert>
      ) : null}
      {rejected ? (
        <Alert tone="danger" title="The openings were not stored">
          <ul className="list-disc pl-5">
            {rejected.details.map((d, i) => (
              <li key={i}>
                {d.row !== undefined ? `Row ${d.row}` : 'The file'}
                {d.column ? `, column ${d.column}` : ''}: {d.message}
              </li>
            ))}
          </ul>
        </Alert>
      ) : upload.isError ? (
        <ErrorAlert error={upload.error} title="The openings could not be stored" />
      ) : null}
    </div>
  );
}
