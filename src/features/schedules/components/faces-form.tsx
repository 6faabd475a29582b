import { useMemo, useRef, useState } from 'react';
import { z } from 'zod';
import { MAX_SCHEDULE_FACES } from '../../../../shared/schemas/schedule-upload.schema';
import type { ScheduleResponse, StoredFace } from '../../../../shared/schemas/schedule-upload.schema';
import { EDGE_KINDS, TOP_KINDS, scheduleSchema } from '../../../../shared/schemas/schedule.schema';
import type { ScheduleRowInput } from '../../../../shared/schemas/schedule.schema';
import { Form, SubmitButton } from '../../../components/form/form';
import { useZodForm } from '../../../components/form/use-zod-form';
import type { ZodForm } from '../../../components/form/use-zod-form';
import { Button } from '../../../components/ui/button';
import { useSaveSchedule } from '../api/save-schedule';

const NUMBER_COLUMNS = ['quantity', 'pitch_deg', 'rafter_mm', 'run_mm', 'eaves_mm', 'top_mm'] as const;
type NumberColumn = (typeof NUMBER_COLUMNS)[number];

interface FaceRow {
  key: number;
  building: string;
  face: string;
  quantity: string;
  pitch_deg: string;
  rafter_mm: string;
  run_mm: string;
  eaves_mm: string;
  top_mm: string;
  left: string;
  right: string;
  top: string;
}

const LABELS: Record<'building' | 'face' | NumberColumn | 'left' | 'right' | 'top', string> = {
  building: 'Building',
  face: 'Face',
  quantity: 'Quantity',
  pitch_deg: 'Pitch (°)',
  rafter_mm: 'Rafter (mm)',
  run_mm: 'Run on plan (mm)',
  eaves_mm: 'Eaves (mm)',
  top_mm: 'Top edge (mm)',
  left: 'Left edge',
  right: 'Right edge',
  top: 'Top',
};

/** The whole list as the API takes it: faces checked with the same schema the server uses. */
const facesFormSchema = z.object({ faces: scheduleSchema });

/** A typed number, or the text itself so the schema can say it is not one; blank is left out. */
function numberOrText(text: string): number | string | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  return /^[+-]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : t;
}

export function rowToInput(row: FaceRow): ScheduleRowInput {
  const out: Record<string, unknown> = { face: row.face, left: row.left, right: row.right, top: row.top };
  if (row.building.trim() !== '') out.building = row.building;
  for (const column of NUMBER_COLUMNS) {
    const value = numberOrText(row[column]);
    if (value !== undefined) out[column] = value;
  }
  return out as ScheduleRowInput;
}

const round = (v: number) => String(Math.round(v * 10) / 10);

function fromStored(face: StoredFace, key: number): FaceRow {
  const bothVerges = face.left === 'verge' && face.right === 'verge';
  return {
    key,
    building: face.building,
    face: face.face,
    quantity: String(face.quantity),
    pitch_deg: String(face.pitch_deg),
    rafter_mm: round(face.rafter_mm),
    // The stored run is worked out from the rafter; sending both would only invite a rounding clash.
    run_mm: '',
    eaves_mm: round(face.eaves_mm),
    top_mm: bothVerges ? '' : round(face.top_mm),
    left: face.left,
    right: face.right,
    top: face.top,
  };
}

function blankRow(key: number, building = '1'): FaceRow {
  return { key, building, face: '', quantity: '1', pitch_deg: '', rafter_mm: '', run_mm: '', eaves_mm: '', top_mm: '', left: 'verge', right: 'verge', top: 'ridge' };
}

function FaceFields({ form, row, index, onChange, onRemove, canRemove }: { form: ZodForm; row: FaceRow; index: number; onChange: (patch: Partial<FaceRow>) => void; onRemove: () => void; canRemove: boolean }) {
  const field = (column: keyof typeof LABELS) => {
    const name = `faces.${index}.${column}`;
    const error = form.fieldErrors[name];
    const id = `${form.id}-${index}-${column}`;
    const common = {
      id,
      name,
      'aria-invalid': error ? true : undefined,
      'aria-describedby': error ? `${id}-error` : undefined,
      className: `block min-h-tap w-full rounded-md border bg-white px-2 ${error ? 'border-brick-600 ring-1 ring-brick-600' : 'border-ink-300'}`,
    } as const;
    const control =
      column === 'left' || column === 'right' || column === 'top' ? (
        <select
          {...common}
          value={row[column]}
          onChange={(event) => {
            form.clearFieldError(name);
            onChange({ [column]: event.target.value });
          }}
        >
          {(column === 'top' ? TOP_KINDS : EDGE_KINDS).map((kind) => (
            <option key={kind} value={kind}>
              {kind.replace('_', ' ')}
            </option>
          ))}
        </select>
      ) : (
        <input
          {...common}
          value={row[column]}
          inputMode={column === 'building' || column === 'face' ? undefined : 'decimal'}
          autoComplete="off"
          onChange={(event) => {
            form.clearFieldError(name);
            onChange({ [column]: event.target.value });
          }}
        />
      );
    return (
      <div key={column}>
        <label htmlFor={id} className="mb-1 block text-sm font-medium">
          {LABELS[column]}
        </label>
        {control}
        {error ? (
          <p id={`${id}-error`} className="mt-1 text-sm font-medium text-brick-700">
            {error}
          </p>
        ) : null}
      </div>
    );
  };
  return (
    <fieldset className="rounded-md border border-mortar-300 bg-white p-3">
      <legend className="px-1 font-semibold">
        Face {index + 1}
        {row.face ? `: ${row.face}` : ''}
      </legend>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-6">
        {(['building', 'face', 'quantity', 'pitch_deg', 'rafter_mm', 'run_mm', 'eaves_mm', 'top_mm', 'left', 'right', 'top'] as const).map(field)}
        <div className="flex items-end">
          <Button variant="ghost" disabled={!canRemove} onClick={onRemove} aria-label={`Remove face ${index + 1}${row.face ? ` (${row.face})` : ''}`}>
            Remove
          </Button>
        </div>
      </div>
    </fieldset>
  );
}

interface FacesFormProps {
  projectId: number;
  /** The faces to start from: the schedule in use, or none for a first schedule. */
  initial: readonly StoredFace[];
  onSaved: (schedule: ScheduleResponse) => void;
}

/** Faces typed or corrected by hand, saved as the next schedule version. */
export function FacesForm({ projectId, initial, onSaved }: FacesFormProps) {
  const save = useSaveSchedule(projectId);
  const nextKey = useRef(initial.length + 2);
  const [rows, setRows] = useState<FaceRow[]>(() => (initial.length > 0 ? initial.map((face, i) => fromStored(face, i + 1)) : [blankRow(1)]));
  const extraValues = useMemo(() => ({ faces: rows.map(rowToInput) }), [rows]);
  const form = useZodForm({
    schema: facesFormSchema,
    extraValues,
    onSubmit: async () => onSaved(await save.mutateAsync(extraValues.faces)),
  });

  const update = (key: number, patch: Partial<FaceRow>) => setRows((list) => list.map((row) => (row.key === key ? { ...row, ...patch } : row)));

  return (
    <Form form={form} label="Roof faces" className="space-y-4">
      <p className="text-sm text-ink-700">
        Give rafter or run (or both, if they agree with the pitch). Leave the top edge blank for a face as wide at the top as at the eaves,
        or 0 for a triangular hip end. Saving stores a new version; the earlier ones are kept.
      </p>
      {rows.map((row, index) => (
        <FaceFields
          key={row.key}
          form={form}
          row={row}
          index={index}
          canRemove={rows.length > 1}
          onChange={(patch) => update(row.key, patch)}
          onRemove={() => setRows((list) => list.filter((r) => r.key !== row.key))}
        />
      ))}
      <div className="flex flex-wrap gap-3">
        <Button
          variant="secondary"
          disabled={rows.length >= MAX_SCHEDULE_FACES}
          onClick={() => setRows((list) => [...list, blankRow(nextKey.current++, list[list.length - 1]?.building ?? '1')])}
        >
          Add a face
        </Button>
        <SubmitButton size="lg">Save as a new version</SubmitButton>
      </div>
    </Form>
  );
}
