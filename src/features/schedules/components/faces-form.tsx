import { useMemo, useRef, useState } from 'react';
import * as z from 'zod/mini';
import { OPENING_KINDS, openingsSchema } from '../../../../shared/schemas/openings.schema';
import type { OpeningRowInput } from '../../../../shared/schemas/openings.schema';
import { MAX_SCHEDULE_FACES } from '../../../../shared/schemas/schedule-upload.schema';
import type { ScheduleResponse, StoredFace, StoredOpening } from '../../../../shared/schemas/schedule-upload.schema';
import { EDGE_KINDS, TOP_KINDS, faceKey, scheduleSchema } from '../../../../shared/schemas/schedule.schema';
import type { ScheduleRowInput } from '../../../../shared/schemas/schedule.schema';
import { FieldMessage, Form, SubmitButton } from '../../../components/form/fields';
import { useSchemaForm } from '../../../components/form/use-schema-form';
import type { SchemaForm } from '../../../components/form/use-schema-form';
import { Button } from '../../../components/ui/button';
import { useSaveSchedule } from '../api/save-schedule';

const NUMBER_COLUMNS = ['quantity', 'pitch_deg', 'rafter_mm', 'run_mm', 'eaves_mm', 'top_mm'] as const;
type NumberColumn = (typeof NUMBER_COLUMNS)[number];

interface OpeningRow {
  key: number;
  kind: string;
  width_mm: string;
  height_mm: string;
  quantity: string;
}

const OPENING_WORDS: Record<(typeof OPENING_KINDS)[number], string> = {
  roof_window: 'Roof window',
  chimney: 'Chimney',
  dormer: 'Dormer',
  hatch: 'Hatch',
};

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
  ridge: string;
  openings: OpeningRow[];
  /** Stored without a top edge beside a hip or valley: its top was taken as the eaves, so it is asked for again. */
  topAssumed?: boolean;
}

const LABELS: Record<'building' | 'face' | NumberColumn | 'left' | 'right' | 'top' | 'ridge', string> = {
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
  ridge: 'Ridge name',
};

/** The whole list as the API takes it: faces and their openings checked with the same schemas the server uses. */
const facesFormSchema = z.object({ faces: scheduleSchema, openings: openingsSchema });

/** A typed number, or the text itself so the schema can say it is not one; blank is left out. */
function numberOrText(text: string): number | string | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  return /^[+-]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : t;
}

export function rowToInput(row: FaceRow): ScheduleRowInput {
  const out: Record<string, unknown> = { face: row.face, left: row.left, right: row.right, top: row.top };
  if (row.building.trim() !== '') out.building = row.building;
  if (row.ridge.trim() !== '') out.ridge = row.ridge;
  for (const column of NUMBER_COLUMNS) {
    const value = numberOrText(row[column]);
    if (value !== undefined) out[column] = value;
  }
  return out as ScheduleRowInput;
}

/** Each face's openings, named by its building and face, in one list as the API takes them. */
export function openingsToInput(rows: readonly FaceRow[]): OpeningRowInput[] {
  return rows.flatMap((row) =>
    row.openings.map((o) => {
      const out: Record<string, unknown> = { face: row.face, kind: o.kind };
      if (row.building.trim() !== '') out.building = row.building;
      for (const column of ['width_mm', 'height_mm', 'quantity'] as const) {
        const value = numberOrText(o[column]);
        if (value !== undefined) out[column] = value;
      }
      return out as OpeningRowInput;
    }),
  );
}

const round = (v: number) => String(Math.round(v * 10) / 10);

function fromStored(face: StoredFace, key: number, openings: readonly StoredOpening[], nextKey: () => number): FaceRow {
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
    // An assumed top (the eaves, put in by a migration) is not sent back as if someone had given it.
    top_mm: bothVerges || face.top_assumed ? '' : round(face.top_mm),
    left: face.left,
    right: face.right,
    top: face.top,
    ridge: face.ridge ?? '',
    ...(face.top_assumed ? { topAssumed: true } : {}),
    openings: openings.map((o) => ({ key: nextKey(), kind: o.kind, width_mm: round(o.width_mm), height_mm: round(o.height_mm), quantity: String(o.quantity) })),
  };
}

function blankRow(key: number, building = '1'): FaceRow {
  return { key, building, face: '', quantity: '1', pitch_deg: '', rafter_mm: '', run_mm: '', eaves_mm: '', top_mm: '', left: 'verge', right: 'verge', top: 'ridge', ridge: '', openings: [] };
}

const TOP_ASSUMED_HINT = 'Needed: this face was stored without its top edge, which was taken as the eaves. Give the top edge (0 for a triangular hip end).';

const inputClasses = (error: string | undefined) => `block min-h-tap w-full rounded-md border bg-white px-2 ${error ? 'border-brick-600 ring-1 ring-brick-600' : 'border-ink-300'}`;

/** The openings of one face: a small table typed row by row, named in the form by their place in the whole list. */
function OpeningsFields({
  form,
  row,
  faceIndex,
  firstIndex,
  onChange,
  nextKey,
}: {
  form: SchemaForm;
  row: FaceRow;
  faceIndex: number;
  firstIndex: number;
  onChange: (openings: OpeningRow[]) => void;
  nextKey: () => number;
}) {
  const update = (key: number, patch: Partial<OpeningRow>) => onChange(row.openings.map((o) => (o.key === key ? { ...o, ...patch } : o)));
  const cell = (o: OpeningRow, i: number, column: 'kind' | 'width_mm' | 'height_mm' | 'quantity', label: string) => {
    const name = `openings.${firstIndex + i}.${column}`;
    const error = form.fieldError(name);
    const id = `${form.id}-${faceIndex}-opening-${o.key}-${column}`;
    const common = {
      id,
      'aria-invalid': error ? true : undefined,
      'aria-describedby': error ? `${id}-error` : undefined,
      className: inputClasses(error),
    } as const;
    return (
      <div>
        <label htmlFor={id} className="mb-1 block text-sm font-medium">
          {label}
        </label>
        {column === 'kind' ? (
          <select
            {...common}
            value={o.kind}
            onChange={(event) => {
              form.clearFieldError(name);
              update(o.key, { kind: event.target.value });
            }}
          >
            {OPENING_KINDS.map((kind) => (
              <option key={kind} value={kind}>
                {OPENING_WORDS[kind]}
              </option>
            ))}
          </select>
        ) : (
          <input
            {...common}
            value={o[column]}
            inputMode="decimal"
            autoComplete="off"
            onChange={(event) => {
              form.clearFieldError(name);
              update(o.key, { [column]: event.target.value });
            }}
          />
        )}
        {error ? <FieldMessage id={`${id}-error`}>{error}</FieldMessage> : null}
      </div>
    );
  };
  return (
    <div className="mt-3 space-y-2 border-t border-mortar-200 pt-3">
      <p className="text-sm font-semibold">
        Openings in this face{row.openings.length > 0 ? ` (${row.openings.length})` : ''}
        <span className="font-normal text-ink-600"> · width across the slope, height up the slope; in every copy of the face</span>
      </p>
      {row.openings.map((o, i) => (
        <div key={o.key} className="grid grid-cols-2 gap-3 sm:grid-cols-5">
          {cell(o, i, 'kind', 'Kind')}
          {cell(o, i, 'width_mm', 'Width (mm)')}
          {cell(o, i, 'height_mm', 'Height (mm)')}
          {cell(o, i, 'quantity', 'Quantity')}
          <div className="flex items-end">
            <Button variant="ghost" onClick={() => onChange(row.openings.filter((x) => x.key !== o.key))} aria-label={`Remove opening ${i + 1} of face ${faceIndex + 1}`}>
              Remove
            </Button>
          </div>
        </div>
      ))}
      <Button
        variant="ghost"
        onClick={() => onChange([...row.openings, { key: nextKey(), kind: 'roof_window', width_mm: '', height_mm: '', quantity: '1' }])}
        aria-label={`Add an opening to face ${faceIndex + 1}${row.face ? ` (${row.face})` : ''}`}
      >
        Add an opening
      </Button>
    </div>
  );
}

function FaceFields({
  form,
  row,
  index,
  firstOpening,
  onChange,
  onRemove,
  canRemove,
  nextKey,
}: {
  form: SchemaForm;
  row: FaceRow;
  index: number;
  firstOpening: number;
  onChange: (patch: Partial<FaceRow>) => void;
  onRemove: () => void;
  canRemove: boolean;
  nextKey: () => number;
}) {
  const field = (column: keyof typeof LABELS) => {
    const name = `faces.${index}.${column}`;
    const error = form.fieldError(name);
    const id = `${form.id}-${index}-${column}`;
    const hint = column === 'top_mm' && row.topAssumed && row.top_mm.trim() === '' && (row.left !== 'verge' || row.right !== 'verge') ? TOP_ASSUMED_HINT : null;
    const common = {
      id,
      'aria-invalid': error ? true : undefined,
      'aria-describedby': [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined,
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
        {hint ? (
          <p id={`${id}-hint`} className="mt-1 text-sm font-medium text-brick-700">
            {hint}
          </p>
        ) : null}
        {error ? <FieldMessage id={`${id}-error`}>{error}</FieldMessage> : null}
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
        {(['building', 'face', 'quantity', 'pitch_deg', 'rafter_mm', 'run_mm', 'eaves_mm', 'top_mm', 'left', 'right', 'top', 'ridge'] as const).map(field)}
        <div className="flex items-end">
          <Button variant="ghost" disabled={!canRemove} onClick={onRemove} aria-label={`Remove face ${index + 1}${row.face ? ` (${row.face})` : ''}`}>
            Remove
          </Button>
        </div>
      </div>
      <OpeningsFields form={form} row={row} faceIndex={index} firstIndex={firstOpening} onChange={(openings) => onChange({ openings })} nextKey={nextKey} />
    </fieldset>
  );
}

/** The faces and openings live in state: their inputs show their own errors by path. */
const isRowPath = (path: string) => /^(faces|openings)\.\d+\./.test(path);

interface FacesFormProps {
  projectId: number;
  /** The faces to start from: the schedule in use, or none for a first schedule. */
  initial: readonly StoredFace[];
  /** The openings of those faces. */
  initialOpenings?: readonly StoredOpening[];
  onSaved: (schedule: ScheduleResponse) => void;
}

/** Faces typed or corrected by hand, saved as the next schedule version. */
export function FacesForm({ projectId, initial, initialOpenings = [], onSaved }: FacesFormProps) {
  const save = useSaveSchedule(projectId);
  // Faces are keyed 1…n and their openings after them, so keys made later start past both.
  const nextKey = useRef(initial.length + initialOpenings.length + 2);
  const takeKey = () => nextKey.current++;
  const [rows, setRows] = useState<FaceRow[]>(() => {
    if (initial.length === 0) return [blankRow(1)];
    let openingKey = initial.length + 2;
    const byFace = new Map<string, StoredOpening[]>();
    for (const o of initialOpenings) {
      const key = faceKey(o.building, o.face);
      byFace.set(key, [...(byFace.get(key) ?? []), o]);
    }
    return initial.map((face, i) => fromStored(face, i + 1, byFace.get(faceKey(face.building, face.face)) ?? [], () => openingKey++));
  });
  const extraValues = useMemo(() => ({ faces: rows.map(rowToInput), openings: openingsToInput(rows) }), [rows]);
  const form = useSchemaForm({
    schema: facesFormSchema,
    extraValues,
    statePaths: isRowPath,
    onSubmit: async () => onSaved(await save.mutateAsync({ faces: extraValues.faces, openings: extraValues.openings })),
  });
  const firstOpenings: number[] = [];
  rows.reduce((n, row) => {
    firstOpenings.push(n);
    return n + row.openings.length;
  }, 0);

  const update = (key: number, patch: Partial<FaceRow>) => setRows((list) => list.map((row) => (row.key === key ? { ...row, ...patch } : row)));

  return (
    <Form form={form} label="Roof faces" className="space-y-4">
      <p className="text-sm text-ink-700">
        Give rafter or run (or both, if they agree with the pitch; rafter alone from 80°). Give the top edge beside a hip or valley (0 for a triangular hip end); leave it blank for a face as wide at the top as at the
        eaves. Faces with the same ridge name in a building are loaded as one ridge. Saving stores a new version; the earlier ones are kept.
      </p>
      {rows.map((row, index) => (
        <FaceFields
          key={row.key}
          form={form}
          row={row}
          index={index}
          firstOpening={firstOpenings[index]}
          nextKey={takeKey}
          canRemove={rows.length > 1}
          onChange={(patch) => update(row.key, patch)}
          onRemove={() => setRows((list) => list.filter((r) => r.key !== row.key))}
        />
      ))}
      <div className="flex flex-wrap gap-3">
        <Button variant="secondary" disabled={rows.length >= MAX_SCHEDULE_FACES} onClick={() => setRows((list) => [...list, blankRow(nextKey.current++, list[list.length - 1]?.building ?? '1')])}>
          Add a face
        </Button>
        <SubmitButton size="lg">Save as a new version</SubmitButton>
      </div>
    </Form>
  );
}
