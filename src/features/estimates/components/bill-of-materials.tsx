import { Fragment } from 'react';
import type { Estimate } from '../../../../shared/schemas/estimate.schema';
import { CATEGORY_LABELS } from '../../../../shared/schemas/catalogue.schema';
import { DataTable, dataTableColumns } from '../../../components/ui/data-table';
import { Alert } from '../../../components/ui/alert';
import { groupBillLines, formatQuantity } from '../lib/bill';
import type { BillGroup } from '../lib/bill';
import { formatMoney } from '../../../lib/format';

type BillLine = Estimate['lines'][number];

interface BillRow {
  line: BillLine;
  group: BillGroup;
  first: boolean;
}

const FIGURE_WORDS: Record<BillLine['figure'], string> = {
  tiles_order: 'tiles to order, waste included',
  ridge_tiles: 'ridge tiles, waste included',
  hip_tiles: 'hip tiles, waste included',
  ridge_and_hip_tiles: 'ridge and hip tiles, waste included',
  batten_lengths: 'stock lengths from the cutting plan, waste included',
  batten_nails: 'one nail at every rafter crossing',
  tile_nails: 'nails by the fixing rule',
  clips: 'clips at the eaves, the verges and, on steep pitches, every tail',
  underlay_rolls: 'rolls for the slope area with laps, waste included',
  valley_m: 'valley length',
  eaves_tiles_order: 'a course of short eaves tiles at every eaves, waste included',
  top_tiles_order: 'a course of short top tiles under every ridge and top abutment, waste included',
  tile_and_half_order: 'one at each verge of every second full course, waste included',
  valley_units: 'trough units along each valley, lapped',
  dry_verge_units: 'one unit a course on each verge',
  ridge_end_caps: 'one at each ridge end that finishes at a verge',
  hip_irons: 'one at the foot of each hip',
  eaves_m: 'length of every eaves',
  verge_m: 'raking length of every mortar verge',
  flashing_m: 'side and top abutments, aprons and back gutters, summed',
};

const helper = dataTableColumns<BillRow>();
const columns = helper.columns([
  helper.display({
    id: 'category',
    header: 'Category',
    cell: (info) => (
      // Every row names its category for screen readers; sighted readers see it once per group.
      <span className={info.row.original.first ? 'font-semibold' : 'sr-only'}>{info.row.original.group.label}</span>
    ),
  }),
  helper.display({
    id: 'item',
    header: 'Item',
    cell: (info) => {
      const { line } = info.row.original;
      return (
        <span className="block min-w-56">
          <span className="font-medium">{line.description}</span>
          {line.sku ? <span className="block font-mono text-xs text-ink-600">{line.sku}</span> : null}
        </span>
      );
    },
  }),
  helper.display({
    id: 'quantity',
    header: 'Needed',
    cell: (info) => {
      const { line } = info.row.original;
      return (
        <span className="block whitespace-nowrap tabular-nums" title={FIGURE_WORDS[line.figure]}>
          {formatQuantity(line.quantity, line.unit)}
        </span>
      );
    },
  }),
  helper.display({
    id: 'packs',
    header: 'Packs',
    cell: (info) => {
      const { line } = info.row.original;
      return (
        <span className="whitespace-nowrap tabular-nums">
          {line.packs.toLocaleString('en-GB')}
          {line.pack_size > 1 ? <span className="text-ink-600"> × {line.pack_size.toLocaleString('en-GB')}</span> : null}
        </span>
      );
    },
  }),
  helper.display({
    id: 'unit_price',
    header: 'Pack price',
    cell: (info) => <span className="whitespace-nowrap tabular-nums">{formatMoney(info.row.original.line.unit_price)}</span>,
  }),
  helper.display({
    id: 'total',
    header: 'Total',
    cell: (info) => <span className="font-semibold whitespace-nowrap tabular-nums">{formatMoney(info.row.original.line.total)}</span>,
  }),
]);

interface BillOfMaterialsProps {
  lines: readonly BillLine[];
  notCounted: Estimate['not_counted'];
  subtotal: number | null;
}

/** The estimate's bill of materials, grouped by category, with pack rounding and the branch's prices. */
export function BillOfMaterials({ lines, notCounted, subtotal }: BillOfMaterialsProps) {
  const groups = groupBillLines(lines);
  const rows: BillRow[] = groups.flatMap((group) => group.lines.map((line, i) => ({ line, group, first: i === 0 })));
  return (
    <div className="space-y-4">
      <DataTable caption="Bill of materials" captionHidden columns={columns} data={rows} getRowId={(row) => String(row.line.id)} minWidthClass="min-w-[46rem]" />
      <dl className="grid max-w-md grid-cols-[1fr_auto] gap-x-6 gap-y-1" aria-label="Totals by category">
        {groups.some((group) => group.lines.length > 1)
          ? groups.map((group) => (
              <Fragment key={group.category}>
                <dt className="text-ink-700">{group.label}</dt>
                <dd className="text-right tabular-nums">{formatMoney(group.subtotal)}</dd>
              </Fragment>
            ))
          : null}
        <dt className="border-t border-mortar-300 pt-1 font-semibold">Subtotal (before delivery and VAT)</dt>
        <dd className="border-t border-mortar-300 pt-1 text-right font-bold tabular-nums" data-testid="bill-subtotal">
          {subtotal === null ? 'No prices (generic system)' : formatMoney(subtotal)}
        </dd>
      </dl>
      {notCounted.length > 0 ? (
        <Alert tone="info" title="Not counted by the estimate" live={false}>
          <ul className="list-disc space-y-1 pl-5">
            {notCounted.map((item) => (
              <li key={`${item.category}-${item.sku ?? item.description}`}>
                <span className="font-medium">
                  {CATEGORY_LABELS[item.category]}: {item.description}
                </span>{' '}
                — {item.message}
              </li>
            ))}
          </ul>
        </Alert>
      ) : null}
    </div>
  );
}
