import type ExcelJS from 'exceljs';
import { loadExcel } from '../../documents/excel';
import Papa from 'papaparse';
import { ACCESSORY_WORDS, type Load, type Pallet } from '../../../shared/engine/delivery';
import type { FaceResult } from '../../../shared/engine/result';
import { CATEGORY_LABELS } from '../../../shared/schemas/catalogue.schema';
import type { Estimate } from '../../../shared/schemas/estimate.schema';
import type { AuthUser } from '../../auth/auth-user';
import type { EstimatesService } from '../estimates/estimates.service';
import type { ProjectsService } from '../projects/projects.service';
import { safeCell } from './spreadsheet-text';

interface Column<T> {
  header: string;
  width: number;
  /** Excel number format, for the column or per row; text columns have none. */
  numFmt?: string | ((row: T) => string);
  value: (row: T) => string | number | null;
}

const MONEY = '#,##0.00';
const WHOLE = '#,##0';
const ONE_DP = '#,##0.0';
const TWO_DP = '#,##0.00';

/** Money leaves the server in minor units everywhere except a spreadsheet, which shows pounds and pence. */
const major = (minor: number | null) => (minor === null ? null : minor / 100);

const BILL_COLUMNS: Column<Estimate['lines'][number]>[] = [
  { header: 'Category', width: 14, value: (l) => CATEGORY_LABELS[l.category] },
  { header: 'SKU', width: 16, value: (l) => l.sku },
  { header: 'Description', width: 48, value: (l) => l.description },
  { header: 'Quantity', width: 11, numFmt: (l) => (Number.isInteger(l.quantity) ? WHOLE : TWO_DP), value: (l) => l.quantity },
  { header: 'Unit', width: 8, value: (l) => l.unit },
  { header: 'Pack size', width: 10, numFmt: WHOLE, value: (l) => l.pack_size },
  { header: 'Packs', width: 9, numFmt: WHOLE, value: (l) => l.packs },
  { header: 'Pack price', width: 12, numFmt: MONEY, value: (l) => major(l.unit_price) },
  { header: 'Total', width: 13, numFmt: MONEY, value: (l) => major(l.total) },
];

const FACE_COLUMNS: Column<FaceResult>[] = [
  { header: 'Building', width: 14, value: (f) => f.building },
  { header: 'Face', width: 18, value: (f) => f.face },
  { header: 'Quantity', width: 9, numFmt: WHOLE, value: (f) => f.quantity },
  { header: 'Pitch (°)', width: 9, numFmt: ONE_DP, value: (f) => f.pitch_deg },
  { header: 'Rafter (mm)', width: 11, numFmt: WHOLE, value: (f) => f.rafter_mm },
  { header: 'Slope area (m²)', width: 14, numFmt: TWO_DP, value: (f) => f.slope_area_m2 },
  { header: 'Headlap (mm)', width: 12, numFmt: WHOLE, value: (f) => f.headlap_mm },
  { header: 'Gauge (mm)', width: 11, numFmt: ONE_DP, value: (f) => f.gauge_mm },
  { header: 'Courses', width: 9, numFmt: WHOLE, value: (f) => f.courses },
  { header: 'Tiles per course', width: 14, numFmt: WHOLE, value: (f) => f.tiles_per_course },
  { header: 'Cover width (mm)', width: 15, numFmt: ONE_DP, value: (f) => f.cover_width_mm },
  { header: 'Verge overhang (mm)', width: 17, numFmt: ONE_DP, value: (f) => f.verge_overhang_mm },
  { header: 'Whole tiles', width: 11, numFmt: WHOLE, value: (f) => f.whole_tiles },
  { header: 'Half tiles', width: 10, numFmt: WHOLE, value: (f) => f.half_tiles },
  { header: 'Cut tiles', width: 10, numFmt: WHOLE, value: (f) => f.cut_tiles },
  { header: 'Tiles', width: 9, numFmt: WHOLE, value: (f) => f.tiles },
  { header: 'Batten (m)', width: 11, numFmt: ONE_DP, value: (f) => f.batten_m },
  { header: 'Stacks', width: 8, numFmt: WHOLE, value: (f) => f.stacks },
  { header: 'Load (kg)', width: 11, numFmt: ONE_DP, value: (f) => f.load_kg },
  { header: 'Eaves tiles', width: 11, numFmt: WHOLE, value: (f) => f.eaves_tiles ?? 0 },
  { header: 'Top tiles', width: 10, numFmt: WHOLE, value: (f) => f.top_tiles ?? 0 },
  { header: 'Tile-and-a-half', width: 14, numFmt: WHOLE, value: (f) => f.tile_and_half ?? 0 },
  { header: 'Openings (m²)', width: 13, numFmt: TWO_DP, value: (f) => f.openings_area_m2 ?? 0 },
];

/** One row per thing on a pallet: each face its tiles serve (or spare tiles), or each accessory. */
interface PalletRow {
  pallet: Pallet;
  building: string | null;
  face: string | null;
  item: string | null;
  tiles: number | null;
  quantity: number | null;
}

function palletRows(pallets: readonly Pallet[]): PalletRow[] {
  return pallets.flatMap((p) => [
    ...p.faces.map((f) => ({ pallet: p, building: f.face === 'spare' ? null : f.building, face: f.face === 'spare' ? 'Spare tiles (waste allowance)' : f.face, item: null, tiles: f.tiles, quantity: null })),
    ...p.items.map((i) => ({ pallet: p, building: null, face: null, item: ACCESSORY_WORDS[i.item]?.label ?? i.item, tiles: null, quantity: i.quantity })),
  ]);
}

const PALLET_COLUMNS: Column<PalletRow>[] = [
  { header: 'Pallet', width: 8, numFmt: WHOLE, value: (r) => r.pallet.n },
  { header: 'Kind', width: 12, value: (r) => (r.pallet.kind === 'tiles' ? 'Tiles' : 'Accessories') },
  { header: 'Building', width: 14, value: (r) => r.building },
  { header: 'Face', width: 28, value: (r) => r.face },
  { header: 'Item', width: 16, value: (r) => r.item },
  { header: 'Tiles', width: 9, numFmt: WHOLE, value: (r) => r.tiles },
  { header: 'Quantity', width: 10, numFmt: WHOLE, value: (r) => r.quantity },
  { header: 'Pallet tiles', width: 11, numFmt: WHOLE, value: (r) => r.pallet.tiles },
  { header: 'Pallet weight (kg)', width: 17, numFmt: ONE_DP, value: (r) => r.pallet.weight_kg },
];

const LOAD_COLUMNS: Column<Load>[] = [
  { header: 'Load', width: 7, numFmt: WHOLE, value: (l) => l.load },
  { header: 'Pallets, in loading order (last off loaded first)', width: 44, value: (l) => l.pallets.join(', ') },
  { header: 'Pallet count', width: 12, numFmt: WHOLE, value: (l) => l.pallets.length },
  { header: 'Weight (kg)', width: 12, numFmt: ONE_DP, value: (l) => l.weight_kg },
];

/** One row per loading batten of a face: which batten (counted from the eaves), how many stacks go on it. */
interface StackRow {
  face: FaceResult;
  row: number;
  stacks: number;
  tiles: number;
}

function stackRows(faces: readonly FaceResult[], everyNth: number, stackSize: number): StackRow[] {
  return faces.flatMap((f) => f.stacks_by_row.map((stacks, i) => ({ face: f, row: f.courses - i * everyNth, stacks, tiles: stacks * stackSize })));
}

const STACK_COLUMNS: Column<StackRow>[] = [
  { header: 'Building', width: 14, value: (r) => r.face.building },
  { header: 'Face', width: 18, value: (r) => r.face.face },
  { header: 'Copies', width: 8, numFmt: WHOLE, value: (r) => r.face.quantity },
  { header: 'Batten from the eaves', width: 20, numFmt: WHOLE, value: (r) => r.row },
  { header: 'Stacks', width: 8, numFmt: WHOLE, value: (r) => r.stacks },
  { header: 'Tiles (full stacks)', width: 17, numFmt: WHOLE, value: (r) => r.tiles },
  { header: 'Face stacks', width: 11, numFmt: WHOLE, value: (r) => r.face.stacks },
  { header: 'Face load (kg)', width: 13, numFmt: ONE_DP, value: (r) => r.face.load_kg },
];

function addTable<T>(wb: ExcelJS.Workbook, name: string, columns: Column<T>[], rows: T[]): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] });
  ws.columns = columns.map((c) => ({ header: c.header, width: c.width }));
  ws.getRow(1).font = { bold: true };
  for (const row of rows) {
    const added = ws.addRow(columns.map((c) => safeCell(c.value(row))));
    columns.forEach((c, i) => {
      if (c.numFmt) added.getCell(i + 1).numFmt = typeof c.numFmt === 'function' ? c.numFmt(row) : c.numFmt;
    });
  }
  ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: columns.length } };
  return ws;
}

function csvOf<T>(columns: Column<T>[], rows: T[]): string {
  const data = [columns.map((c) => c.header), ...rows.map((r) => columns.map((c) => safeCell(c.value(r)) ?? ''))];
  // The BOM makes spreadsheets read the file as UTF-8 (×, ², ° and names with accents).
  return '\uFEFF' + Papa.unparse(data, { newline: '\r\n' });
}

export function exportsService(estimates: EstimatesService, projects: ProjectsService) {
  return {
    async xlsx(user: AuthUser, id: number): Promise<Buffer> {
      const e = await estimates.get(user, id);
      const project = await projects.get(user, e.project_id);
      const { Workbook } = await loadExcel();
      const wb = new Workbook();
      wb.creator = 'Ridgeload';
      wb.created = new Date(e.created_at);

      const bill = addTable(wb, 'Bill of materials', BILL_COLUMNS, e.lines);
      if (e.totals.subtotal !== null) {
        const total = bill.addRow(['Subtotal', null, null, null, null, null, null, null, major(e.totals.subtotal)]);
        total.font = { bold: true };
        total.getCell(BILL_COLUMNS.length).numFmt = MONEY;
      }
      addTable(wb, 'Faces', FACE_COLUMNS, e.result.faces);
      addTable(wb, 'Pallets', PALLET_COLUMNS, palletRows(e.result.pallets));
      addTable(wb, 'Lorry loads', LOAD_COLUMNS, e.result.loads);
      const loading = e.system_input.roof_loading;
      const stacks = addTable(wb, 'Roof loading', STACK_COLUMNS, stackRows(e.result.faces, loading.every_nth_batten, loading.stack_size));
      // Loading a roof is work at height: the sheet a roofer prints carries the cautions with it.
      stacks.addRow([]);
      const nth = loading.every_nth_batten;
      const every = nth === 1 ? 'every batten' : `every ${nth}${nth % 10 === 2 && nth % 100 !== 12 ? 'nd' : nth % 10 === 3 && nth % 100 !== 13 ? 'rd' : 'th'} batten`;
      stacks.addRow([safeCell(`Stacks of ${loading.stack_size} tiles on ${every}, spread along it; load both slopes of a ridge evenly.`)]);
      for (const c of e.cautions) stacks.addRow([safeCell(c)]);

      const about = wb.addWorksheet('About');
      about.columns = [{ width: 24 }, { width: 100 }];
      const facts: [string, string | number][] = [
        ['Site', project.name],
        ['Site address', project.site_address],
        ['Roof system', e.system.name],
        ['Merchant branch', e.system.branch ? `${e.system.branch.name}, ${e.system.branch.merchant.name}` : 'generic system, no prices'],
        ['Schedule version', e.schedule.version],
        ['Estimate', e.id],
        ['Worked out', e.created_at],
        ['Engine version', e.engine_version],
        ['Delivery weight (kg)', e.totals.weight_kg],
        ['Pallets', e.totals.pallets],
      ];
      // The take-off's own figures that are not products on the bill: lengths, counts and flashings.
      const t = e.result.totals;
      const extra: [string, number | undefined][] = [
        ['Verges (m)', t.verge_m],
        ['Eaves (m)', t.eaves_m],
        ['Roof windows', t.roof_windows],
        ['Roof hatches', t.hatches],
        ['Openings (m²)', t.openings_area_m2],
        ['Side abutment flashing (m)', t.flashings?.side_abutment_m],
        ['Top abutment flashing (m)', t.flashings?.top_abutment_m],
        ['Apron flashing (m)', t.flashings?.apron_m],
        ['Back gutter (m)', t.flashings?.back_gutter_m],
      ];
      for (const [k, v] of extra) if (v !== undefined && v > 0) facts.push([k, v]);
      for (const [k, v] of facts) about.addRow([k, safeCell(v)]);
      about.addRow([]);
      for (const w of e.result.warnings) about.addRow(['Warning', safeCell([w.building, w.face, w.message].filter(Boolean).join(' · '))]);
      for (const n of e.not_counted) about.addRow(['Not counted', safeCell(`${n.description}: ${n.message}`)]);
      for (const c of e.cautions) about.addRow(['Caution', safeCell(c)]);
      about.getColumn(1).font = { bold: true };
      about.getColumn(2).alignment = { wrapText: true, vertical: 'top' };

      return Buffer.from(await wb.xlsx.writeBuffer());
    },

    async csv(user: AuthUser, id: number, table: 'bill' | 'faces'): Promise<string> {
      const e = await estimates.get(user, id);
      return table === 'faces' ? csvOf(FACE_COLUMNS, e.result.faces) : csvOf(BILL_COLUMNS, e.lines);
    },
  };
}
