import type { ProductCategory } from '../../../shared/schemas/catalogue.schema';
import { STOCK_REQUIRED, type StockItem } from '../../../shared/schemas/stock.schema';
import type { SheetImportResult } from '../../../shared/schemas/price-list.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { AppError } from '../../http/app-error';
import { priceListRepository } from '../price-list/price-list.repository';
import { invalidSheet, numberCell, readSheet, requireColumns, textCell, toCsv, toXlsx, type SheetColumn, type SheetProblem } from '../price-list/sheet-file';
import { stockRepository } from './stock.repository';

const STOCK_FILE_COLUMNS: SheetColumn<StockItem>[] = [
  { header: 'sku', width: 18, value: (r) => r.sku },
  { header: 'name', width: 50, value: (r) => r.name },
  { header: 'unit', width: 8, value: (r) => r.unit },
  { header: 'on_hand', width: 10, numFmt: '0', value: (r) => r.on_hand },
  { header: 'reserved', width: 10, numFmt: '0', value: (r) => r.reserved },
  { header: 'available', width: 10, numFmt: '0', value: (r) => r.available },
  { header: 'reorder_level', width: 13, numFmt: '0', value: (r) => r.reorder_level },
];

export function stockService({ db }: Pick<AppDeps, 'db'>) {
  const stock = stockRepository(db);
  const branches = priceListRepository(db);

  async function branchOf(user: AuthUser, branchId: number) {
    const branch = await branches.branch(user.organisation.id, branchId);
    if (!branch) throw AppError.notFound('Branch');
    return branch;
  }

  return {
    async list(user: AuthUser, branchId: number, f: { q?: string; category?: ProductCategory; low: boolean }) {
      const branch = await branchOf(user, branchId);
      return { branch, items: await stock.list(user.organisation.id, branchId, f) };
    },

    async update(user: AuthUser, branchId: number, productId: number, v: { on_hand?: number; reorder_level?: number }) {
      await branchOf(user, branchId);
      const item = await stock.item(user.organisation.id, branchId, productId);
      if (!item) throw AppError.notFound('Product at this branch');
      if (!(await db.transaction((trx) => stock.update(trx, branchId, productId, v)))) {
        throw AppError.conflict('below_reserved', `${item.reserved} packs of ${item.sku} are reserved for confirmed orders: on hand cannot be less`, [
          { path: 'on_hand', message: `must be at least the ${item.reserved} packs reserved` },
        ]);
      }
      return (await stock.item(user.organisation.id, branchId, productId))!;
    },

    async exportCounts(user: AuthUser, branchId: number, format: 'csv' | 'xlsx') {
      const branch = await branchOf(user, branchId);
      const items = await stock.list(user.organisation.id, branchId, { low: false });
      const name = `stock-${branch.name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}`;
      return format === 'xlsx' ? { filename: `${name}.xlsx`, body: await toXlsx('Stock', STOCK_FILE_COLUMNS, items) } : { filename: `${name}.csv`, body: toCsv(STOCK_FILE_COLUMNS, items) };
    },

    /**
     * Stock counts from a file: on hand (and the reorder level when the column is there) per SKU the
     * branch sells. A count below what confirmed orders hold is refused. One transaction, or nothing.
     */
    async importCounts(user: AuthUser, branchId: number, bytes: Buffer): Promise<SheetImportResult> {
      await branchOf(user, branchId);
      const sheet = await readSheet(bytes);
      const missing = requireColumns(sheet, STOCK_REQUIRED);
      if (missing.length > 0) throw invalidSheet(missing);
      if (sheet.rows.length === 0) throw invalidSheet([{ row: 2, message: 'the file has a header row but no counts' }]);
      const items = new Map((await stock.list(user.organisation.id, branchId, { low: false })).map((i) => [i.sku.toLowerCase(), i]));
      const hasReorder = sheet.columns.includes('reorder_level');
      const problems: SheetProblem[] = [];
      const seen = new Map<string, number>();
      const changes: { item: StockItem; on_hand: number; reorder_level?: number }[] = [];
      for (const r of sheet.rows) {
        const before = problems.length;
        const sku = textCell(r, 'sku', problems);
        const onHand = numberCell(r, 'on_hand', problems, { decimals: 0, max: 100_000_000 });
        const reorder = hasReorder ? numberCell(r, 'reorder_level', problems, { decimals: 0, required: false, max: 100_000_000 }) : null;
        const item = sku ? items.get(sku.toLowerCase()) : undefined;
        if (sku !== null) {
          if (!item) problems.push({ row: r.row, column: 'sku', message: `"${sku}" is not on this branch's price list: price it first` });
          const first = seen.get(sku.toLowerCase());
          if (first !== undefined) problems.push({ row: r.row, column: 'sku', message: `${sku} is already counted on row ${first}` });
          else seen.set(sku.toLowerCase(), r.row);
        }
        if (item && onHand !== null && onHand < item.reserved) {
          problems.push({ row: r.row, column: 'on_hand', message: `${onHand} is below the ${item.reserved} packs reserved for confirmed orders` });
        }
        if (problems.length === before && item && onHand !== null) changes.push({ item, on_hand: onHand, ...(reorder !== null ? { reorder_level: reorder } : {}) });
      }
      if (problems.length > 0) throw invalidSheet(problems);
      let updated = 0;
      await db.transaction(async (trx) => {
        for (const c of changes) {
          if (c.on_hand === c.item.on_hand && (c.reorder_level === undefined || c.reorder_level === c.item.reorder_level)) continue;
          if (!(await stock.update(trx, branchId, c.item.product_id, { on_hand: c.on_hand, ...(c.reorder_level !== undefined ? { reorder_level: c.reorder_level } : {}) }))) {
            // An order reserved more in the meantime: the whole file is refused, as for any other problem.
            throw invalidSheet([{ column: 'on_hand', message: `${c.item.sku}: more was reserved while the file was read; count again` }]);
          }
          updated++;
        }
      });
      const warnings = sheet.columns
        .filter((c) => !(STOCK_FILE_COLUMNS.map((x) => x.header) as string[]).includes(c))
        .map((c) => ({ code: 'unknown_column', message: `the column "${c}" is not part of a stock count and was ignored` }));
      return { rows: sheet.rows.length, updated, added: 0, unchanged: changes.length - updated, warnings };
    },
  };
}

export type StockService = ReturnType<typeof stockService>;
