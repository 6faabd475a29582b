import { EDGE_KINDS, SCHEDULE_COLUMNS, SCHEDULE_LIMITS, TOP_KINDS } from '../../../../shared/schemas/schedule.schema';
import type { ScheduleColumn } from '../../../../shared/schemas/schedule.schema';
import { Card } from '../../../components/ui/card';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { columnLetter } from '../lib/csv-grid';
import { EXAMPLE_SCHEDULE_URL } from './schedule-import';

interface GuideRow {
  column: ScheduleColumn;
  letter: string;
  need: string;
  meaning: string;
}

const words = (list: readonly string[]) => list.join(', ');

/** What each column means; typed by column so a new schedule column cannot go unexplained. */
const GUIDE: Record<ScheduleColumn, { need: string; meaning: string }> = {
  building: { need: 'Optional (1 if blank)', meaning: 'The house type, block or plot the face belongs to. Faces of one building share its ridge and hips.' },
  face: { need: 'Required', meaning: `A name for the face, unique within its building (e.g. Front, Back, East hip end). At most ${SCHEDULE_LIMITS.maxTextLength} characters.` },
  quantity: { need: 'Optional (1 if blank)', meaning: `How many identical faces: a whole number from 1 to ${SCHEDULE_LIMITS.maxQuantity.toLocaleString('en-GB')}.` },
  pitch_deg: { need: 'Required', meaning: 'Roof pitch in degrees, above 0 and below 90.' },
  rafter_mm: { need: 'This or run_mm', meaning: 'Length up the slope from eaves to top edge, in millimetres. Needed for faces of 80° and steeper.' },
  run_mm: { need: 'This or rafter_mm', meaning: `Length of the rafter measured on plan, in millimetres. Given with rafter_mm, the two must agree with the pitch within ${SCHEDULE_LIMITS.rafterRunTolerance * 100} %.` },
  eaves_mm: { need: 'Required', meaning: 'Length of the eaves (the bottom edge), in millimetres.' },
  top_mm: {
    need: 'Required beside a hip or valley',
    meaning: 'Length of the top edge in millimetres: 0 for a triangular hip end. Required on a face with a hip or valley edge; otherwise left blank, the same as the eaves. Between two verges it must equal the eaves.',
  },
  left: { need: 'Optional (verge)', meaning: `The left-hand edge seen from the eaves: ${words(EDGE_KINDS)}.` },
  right: { need: 'Optional (verge)', meaning: `The right-hand edge seen from the eaves: ${words(EDGE_KINDS)}.` },
  top: { need: 'Optional (ridge)', meaning: `The top edge: ${words(TOP_KINDS)}.` },
  ridge: {
    need: 'Optional',
    meaning: 'A name for the ridge line the top edge meets (e.g. Main), unique within the building: faces with the same name are loaded as one ridge. Left blank, faces are paired by equal top length.',
  },
};

const rows: GuideRow[] = SCHEDULE_COLUMNS.map((column, i) => ({ column, letter: columnLetter(i), ...GUIDE[column] }));

const helper = dataTableColumns<GuideRow>();
const columns = helper.columns([
  helper.accessor('letter', { header: 'In the example', cell: (info) => <span className="font-mono">{info.getValue()}</span> }),
  helper.accessor('column', { header: 'Column', cell: (info) => <code className="font-semibold">{info.getValue()}</code> }),
  helper.accessor('need', { header: 'Needed', enableSorting: false, cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span> }),
  helper.accessor('meaning', { header: 'What to put in it', enableSorting: false, cell: (info) => <span className="block min-w-64">{info.getValue()}</span> }),
]);

/** The columns a schedule file may have, with the example file to start from. */
export function ColumnGuide() {
  return (
    <Card
      title="Column guide"
      actions={
        <a href={EXAMPLE_SCHEDULE_URL} download className="inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2">
          Download the example CSV
        </a>
      }
    >
      <div className="mb-4 space-y-2 text-sm text-ink-700">
        <p>
          The first row names the columns, in any order; case and spaces in the names do not matter. Lengths are millimetres: a figure under {SCHEDULE_LIMITS.metresBelowMm} is taken as metres typed by mistake, and
          anything over {SCHEDULE_LIMITS.maxLengthMm / 1000} m as a unit slip.
        </p>
        <p>Columns the schedule does not know are ignored, with a note. Every problem is listed with its row (the header is row 1) and column.</p>
      </div>
      <DataTable caption="Schedule columns" captionHidden columns={columns} data={rows} getRowId={(row) => row.column} minWidthClass="min-w-[44rem]" />
    </Card>
  );
}
