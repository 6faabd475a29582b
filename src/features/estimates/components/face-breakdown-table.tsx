import { useMemo } from 'react';
import type { EngineWarning, FaceResult } from '../../../../shared/engine/result';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';

interface FaceRow {
  index: number;
  face: FaceResult;
  warnings: EngineWarning[];
}

const n = (v: number, digits = 0) => v.toLocaleString('en-GB', { maximumFractionDigits: digits });
const helper = dataTableColumns<FaceRow>();

const columns = helper.columns([
  helper.accessor((row) => `${row.face.building} ${row.face.face}`, {
    id: 'face',
    header: 'Face',
    sortFn: 'text',
    cell: (info) => (
      <a href={`#face-${info.row.original.index}`} className="block min-w-32 font-semibold text-clay-700 underline underline-offset-2">
        {info.row.original.face.building} · {info.row.original.face.face}
      </a>
    ),
  }),
  helper.accessor((row) => row.face.quantity, { id: 'quantity', header: 'Qty', sortFn: 'alphanumeric' }),
  helper.accessor((row) => row.face.pitch_deg, { id: 'pitch', header: 'Pitch °', sortFn: 'alphanumeric' }),
  helper.accessor((row) => row.face.slope_area_m2, { id: 'area', header: 'Area m²', sortFn: 'alphanumeric', cell: (info) => n(info.getValue(), 2) }),
  helper.accessor((row) => row.face.gauge_mm, { id: 'gauge', header: 'Gauge mm', sortFn: 'alphanumeric', cell: (info) => n(info.getValue(), 1) }),
  helper.accessor((row) => row.face.courses, { id: 'courses', header: 'Courses', sortFn: 'alphanumeric' }),
  helper.accessor((row) => row.face.tiles_per_course, { id: 'per_course', header: 'Tiles / course', sortFn: 'alphanumeric' }),
  helper.accessor((row) => row.face.tiles, {
    id: 'tiles',
    header: 'Tiles',
    sortFn: 'alphanumeric',
    cell: (info) => (
      <span className="whitespace-nowrap" title={`${info.row.original.face.whole_tiles} whole, ${info.row.original.face.half_tiles} halves, ${info.row.original.face.cut_tiles} cut`}>
        {n(info.getValue())}
      </span>
    ),
  }),
  helper.accessor((row) => (row.face.eaves_tiles ?? 0) + (row.face.top_tiles ?? 0) + (row.face.tile_and_half ?? 0), {
    id: 'special',
    header: 'Eaves · top · tile-and-half',
    sortFn: 'alphanumeric',
    cell: (info) =>
      info.getValue() === 0 ? (
        <span className="text-ink-500">—</span>
      ) : (
        <span className="whitespace-nowrap">
          {n(info.row.original.face.eaves_tiles)} · {n(info.row.original.face.top_tiles)} · {n(info.row.original.face.tile_and_half)}
        </span>
      ),
  }),
  helper.accessor((row) => row.face.openings_area_m2 ?? 0, {
    id: 'openings',
    header: 'Openings m²',
    sortFn: 'alphanumeric',
    cell: (info) => (info.getValue() > 0 ? n(info.getValue(), 2) : <span className="text-ink-500">—</span>),
  }),
  helper.accessor((row) => row.face.ridge ?? '', { id: 'ridge', header: 'Ridge', sortFn: 'text' }),
  helper.accessor((row) => row.face.batten_m, { id: 'batten', header: 'Batten m', sortFn: 'alphanumeric', cell: (info) => n(info.getValue(), 1) }),
  helper.accessor((row) => row.face.stacks, {
    id: 'stacks',
    header: 'Stacks / places',
    sortFn: 'alphanumeric',
    cell: (info) => `${info.getValue()} / ${info.row.original.face.stack_positions}`,
  }),
  helper.accessor((row) => row.face.load_kg, { id: 'load', header: 'Load kg', sortFn: 'alphanumeric', cell: (info) => n(info.getValue()) }),
  helper.display({
    id: 'warnings',
    header: 'Check',
    cell: (info) =>
      info.row.original.warnings.length === 0 ? (
        <span className="text-ink-500">—</span>
      ) : (
        <ul className="max-w-72 space-y-1 text-sm text-ochre-800">
          {info.row.original.warnings.map((w, i) => (
            <li key={`${w.code}-${i}`}>{w.message}</li>
          ))}
        </ul>
      ),
  }),
]);

/** The figures that matter while choosing a system, for the narrow preview column. */
const COMPACT = new Set(['quantity', 'gauge', 'courses', 'tiles', 'stacks']);
const compactColumns = helper.columns([
  // No drawings on the page yet, so the face is named, not linked.
  helper.accessor((row) => `${row.face.building} ${row.face.face}`, {
    id: 'face',
    header: 'Face',
    sortFn: 'text',
    cell: (info) => (
      <span className="block min-w-28 font-medium">
        {info.row.original.face.building} · {info.row.original.face.face}
      </span>
    ),
  }),
  ...columns.filter((column) => COMPACT.has(column.id ?? '')),
]);

interface FaceBreakdownTableProps {
  faces: readonly FaceResult[];
  warningsByFace: Map<number, EngineWarning[]>;
  compact?: boolean;
}

/** The engine's figures for each face (one copy; multiply by the quantity for the job), with its warnings on its row. */
export function FaceBreakdownTable({ faces, warningsByFace, compact = false }: FaceBreakdownTableProps) {
  const rows = useMemo(() => faces.map((face, index) => ({ index, face, warnings: warningsByFace.get(index) ?? [] })), [faces, warningsByFace]);
  return <DataTable caption="Figures per face" captionHidden columns={compact ? compactColumns : columns} data={rows} getRowId={(row) => String(row.index)} minWidthClass={compact ? 'min-w-[28rem]' : 'min-w-[80rem]'} />;
}
