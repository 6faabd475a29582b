import type { StoredFace, StoredOpening } from '../../../../shared/schemas/schedule-upload.schema';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';

const helper = dataTableColumns<StoredFace>();
const mm = (value: number) => Math.round(value).toLocaleString('en-GB');
const edge = (value: string) => value.replace('_', ' ');

const columns = helper.columns([
  helper.accessor('position', { header: '#', sortFn: 'alphanumeric' }),
  helper.accessor('building', { header: 'Building', sortFn: 'text' }),
  helper.accessor('face', { header: 'Face', sortFn: 'text', cell: (info) => <span className="font-medium whitespace-nowrap">{info.getValue()}</span> }),
  helper.accessor('quantity', { header: 'Qty', sortFn: 'alphanumeric' }),
  helper.accessor('pitch_deg', { header: 'Pitch °', sortFn: 'alphanumeric' }),
  helper.accessor('rafter_mm', { header: 'Rafter mm', sortFn: 'alphanumeric', cell: (info) => mm(info.getValue()) }),
  helper.accessor('eaves_mm', { header: 'Eaves mm', sortFn: 'alphanumeric', cell: (info) => mm(info.getValue()) }),
  helper.accessor('top_mm', { header: 'Top mm', sortFn: 'alphanumeric', cell: (info) => mm(info.getValue()) }),
  helper.accessor((row) => `${edge(row.left)} / ${edge(row.right)} / ${edge(row.top)}`, {
    id: 'edges',
    header: 'Left / right / top',
    enableSorting: false,
    cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span>,
  }),
  helper.accessor((row) => row.ridge ?? '', { id: 'ridge', header: 'Ridge', sortFn: 'text' }),
  helper.accessor((row) => (row.top_assumed ? 'top taken as eaves' : ''), {
    id: 'notes',
    header: 'Notes',
    enableSorting: false,
    cell: (info) => (info.getValue() ? <span className="whitespace-nowrap font-medium text-brick-700">{info.getValue()}</span> : null),
  }),
]);

const openingHelper = dataTableColumns<StoredOpening>();
const KIND_WORDS: Record<StoredOpening['kind'], string> = { roof_window: 'Roof window', chimney: 'Chimney', dormer: 'Dormer', hatch: 'Hatch' };
const openingColumns = openingHelper.columns([
  openingHelper.accessor('building', { header: 'Building', sortFn: 'text' }),
  openingHelper.accessor('face', { header: 'Face', sortFn: 'text' }),
  openingHelper.accessor('kind', { header: 'Kind', sortFn: 'text', cell: (info) => KIND_WORDS[info.getValue()] }),
  openingHelper.accessor('width_mm', { header: 'Width mm', sortFn: 'alphanumeric', cell: (info) => mm(info.getValue()) }),
  openingHelper.accessor('height_mm', { header: 'Height mm', sortFn: 'alphanumeric', cell: (info) => mm(info.getValue()) }),
  openingHelper.accessor('quantity', { header: 'Qty in each face', sortFn: 'alphanumeric' }),
]);

/** The openings of one stored schedule version: each is in every copy of its face. */
export function ScheduleOpeningsTable({ openings }: { openings: readonly StoredOpening[] }) {
  return <DataTable caption="Openings" captionHidden columns={openingColumns} data={openings} getRowId={(o) => String(o.id)} initialSorting={[{ id: 'building', desc: false }]} minWidthClass="min-w-[36rem]" />;
}

/** The faces of one stored schedule version, as the engine reads them (rafter worked out from run where needed). */
export function ScheduleFacesTable({ faces, caption = 'Roof faces' }: { faces: readonly StoredFace[]; caption?: string }) {
  return <DataTable caption={caption} captionHidden columns={columns} data={faces} getRowId={(face) => String(face.id)} initialSorting={[{ id: 'position', desc: false }]} minWidthClass="min-w-[50rem]" />;
}
