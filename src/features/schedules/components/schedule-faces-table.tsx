import type { StoredFace } from '../../../../shared/schemas/schedule-upload.schema';
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
]);

/** The faces of one stored schedule version, as the engine reads them (rafter worked out from run where needed). */
export function ScheduleFacesTable({ faces, caption = 'Roof faces' }: { faces: readonly StoredFace[]; caption?: string }) {
  return (
    <DataTable
      caption={caption}
      captionHidden
      columns={columns}
      data={faces}
      getRowId={(face) => String(face.id)}
      initialSorting={[{ id: 'position', desc: false }]}
      minWidthClass="min-w-[50rem]"
    />
  );
}
