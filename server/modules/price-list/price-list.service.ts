import type { z } from 'zod';
import { minorDigits, moneyEntryExample, moneyEntryText } from '../../../shared/domain/money-entry';
import { TECHNICAL_SCHEMAS, type ProductCategory, type SystemRole } from '../../../shared/schemas/catalogue.schema';
import {
  PRICE_LIST_REQUIRED,
  type MerchantRoofSystem,
  type SheetImportResult,
  type createProductBodySchema,
  type roofSystemBodySchema,
  type updateProductBodySchema,
  type updateRoofSystemBodySchema,
} from '../../../shared/schemas/price-list.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { AppError } from '../../http/app-error';
import { catalogueRepository, type SystemRow } from '../catalogue/catalogue.repository';
import { buildSystem } from '../catalogue/catalogue.service';
import { priceListRepository, type PriceListRow } from './price-list.repository';
import { invalidSheet, numberCell, readSheet, requireColumns, textCell, toCsv, toXlsx, type SheetColumn, type SheetProblem } from './sheet-file';

type CreateBody = z.output<typeof createProductBodySchema>;
type UpdateBody = z.output<typeof updateProductBodySchema>;
type SystemBody = z.output<typeof roofSystemBodySchema>;
type UpdateSystemBody = z.output<typeof updateRoofSystemBodySchema>;

const invalid = (details: { path: string; message: string }[]) => AppError.unprocessable('validation_failed', 'Some fields are not valid', details);

/** Basis points as a percentage: 2000 → 20, 500 → 5, 1750 → 17.5. */
const percent = (bp: number) => bp / 100;

/**
 * A price list file's columns, the price of one pack in major units of the configured currency with its
 * decimals (12.80 in pounds, 1280 in yen, 12.800 in dinars). The CSV keeps the decimals as text, the
 * workbook a number formatted with them.
 */
export function priceListFileColumns(currency: string): { xlsx: SheetColumn<PriceListRow>[]; csv: SheetColumn<PriceListRow>[] } {
  const digits = minorDigits(currency);
  const common: SheetColumn<PriceListRow>[] = [
    { header: 'sku', width: 18, value: (r) => r.sku },
    { header: 'name', width: 50, value: (r) => r.name },
    { header: 'category', width: 12, value: (r) => r.category },
    { header: 'unit', width: 8, value: (r) => r.unit },
    { header: 'pack_size', width: 10, numFmt: '0', value: (r) => r.pack_size },
    { header: 'pack_weight_kg', width: 14, numFmt: '0.00', value: (r) => r.pack_weight_kg },
    { header: 'tax_rate', width: 9, numFmt: '0.##', value: (r) => percent(r.tax_rate_bp) },
  ];
  const numFmt = digits === 0 ? '0' : `0.${'0'.repeat(digits)}`;
  return {
    xlsx: [...common, { header: 'price', width: 10, numFmt, value: (r) => r.pack_price / 10 ** digits }],
    csv: [...common, { header: 'price', width: 10, value: (r) => moneyEntryText(r.pack_price, currency) }],
  };
}

export function priceListService({ db, config }: Pick<AppDeps, 'db' | 'config'>) {
  const repo = priceListRepository(db);
  const fileColumns = priceListFileColumns(config.currency);
  const priceDigits = minorDigits(config.currency);
  const catalogue = catalogueRepository(db);

  async function branchOf(user: AuthUser, branchId: number) {
    const branch = await repo.branch(user.organisation.id, branchId);
    if (!branch) throw AppError.notFound('Branch');
    return branch;
  }

  async function product(user: AuthUser, id: number) {
    const p = await repo.findProduct(user.organisation.id, id);
    if (!p) throw AppError.notFound('Product');
    return p;
  }

  async function assertSkuFree(user: AuthUser, sku: string, exceptId?: number) {
    const taken = await repo.productIdBySku(user.organisation.id, sku);
    if (taken !== undefined && taken !== exceptId) throw AppError.conflict('sku_taken', `Another product already has the SKU ${sku}`, [{ path: 'sku', message: 'is already used by another product' }]);
  }

  function toMerchantSystem(row: SystemRow): MerchantRoofSystem {
    const built = buildSystem(row);
    return {
      id: row.id,
      name: row.name,
      description: row.description,
      branch: { id: row.branch.id, name: row.branch.name, town: row.branch.town, merchant: row.branch.merchant },
      settings: row.settings,
      components: row.components.map((c) => ({ role: c.role, product_id: c.product.id, sku: c.product.sku, name: c.product.name })),
      offerable: built.ok,
      problems: built.ok ? [] : built.problems,
      archived_at: null,
    };
  }

  async function system(user: AuthUser, id: number) {
    const row = await catalogue.findSystem({ kind: 'merchant', organisationId: user.organisation.id }, id);
    if (!row) throw AppError.notFound('Roof system');
    return toMerchantSystem(row);
  }

  /** Each component must be the merchant's own product of the role's category. */
  async function checkComponents(user: AuthUser, components: Partial<Record<SystemRole, number>>) {
    const products = await repo.productsOf(user.organisation.id, Object.values(components));
    const problems: { path: string; message: string }[] = [];
    for (const [role, id] of Object.entries(components)) {
      const p = products.get(id);
      if (!p) problems.push({ path: `components.${role}`, message: 'is not a product of your catalogue' });
      else if (p.category !== role) problems.push({ path: `components.${role}`, message: `${p.sku} is a ${p.category} product, not a ${role}` });
    }
    if (problems.length > 0) throw invalid(problems);
  }

  return {
    listProducts: (user: AuthUser, f: { q?: string; category?: ProductCategory; archived: 'false' | 'true' | 'all' }) => repo.listProducts(user.organisation.id, f),
    getProduct: product,

    async createProduct(user: AuthUser, body: CreateBody) {
      await assertSkuFree(user, body.sku);
      const id = await db.transaction((trx) => repo.insertProduct(trx, user.organisation.id, body));
      return product(user, id);
    },

    async updateProduct(user: AuthUser, id: number, body: UpdateBody) {
      const existing = await product(user, id);
      if (body.sku) await assertSkuFree(user, body.sku, id);
      const category = body.category ?? existing.category;
      const technical = body.technical ?? existing.technical;
      const checked = TECHNICAL_SCHEMAS[category].safeParse(technical);
      if (!checked.success) throw invalid(checked.error.issues.map((i) => ({ path: ['technical', ...i.path.map(String)].join('.'), message: i.message })));
      await db.transaction((trx) => repo.updateProduct(trx, user.organisation.id, id, body));
      return product(user, id);
    },

    async archiveProduct(user: AuthUser, id: number, archived: boolean) {
      await product(user, id);
      await repo.setArchived(user.organisation.id, id, archived);
      return product(user, id);
    },

    async setBranchPrice(user: AuthUser, branchId: number, productId: number, packPrice: number) {
      await branchOf(user, branchId);
      const p = await product(user, productId);
      if (p.archived_at) throw AppError.conflict('product_archived', `${p.sku} is archived; restore it before selling it`);
      await db.transaction((trx) => repo.setBranchPrice(trx, branchId, productId, packPrice));
      return product(user, productId);
    },

    async listSystems(user: AuthUser, branchId?: number) {
      const rows = await catalogue.listSystems({ kind: 'merchant', organisationId: user.organisation.id }, { branchId });
      return { systems: rows.map(toMerchantSystem) };
    },

    getSystem: system,

    async createSystem(user: AuthUser, body: SystemBody) {
      await branchOf(user, body.branch_id);
      await checkComponents(user, body.components);
      const id = await db.transaction((trx) => repo.insertSystem(trx, user.organisation.id, body, body.components));
      return system(user, id);
    },

    async updateSystem(user: AuthUser, id: number, body: UpdateSystemBody) {
      await system(user, id);
      if (body.components) await checkComponents(user, body.components);
      await db.transaction(async (trx) => {
        await repo.updateSystem(trx, user.organisation.id, id, body);
        if (body.components) await repo.replaceComponents(trx, id, body.components);
      });
      return system(user, id);
    },

    async archiveSystem(user: AuthUser, id: number) {
      await system(user, id);
      await repo.archiveSystem(user.organisation.id, id);
    },

    async exportPriceList(user: AuthUser, branchId: number, format: 'csv' | 'xlsx') {
      const branch = await branchOf(user, branchId);
      const rows = await repo.priceList(user.organisation.id, branchId);
      const name = `price-list-${branch.name.toLowerCase().replace(/[^a-z0-9]+/g, '-')}`;
      return format === 'xlsx' ? { filename: `${name}.xlsx`, body: await toXlsx('Price list', fileColumns.xlsx, rows) } : { filename: `${name}.csv`, body: toCsv(fileColumns.csv, rows) };
    },

    /**
     * A branch's prices from a file: each row names a product of the catalogue by SKU and gives the
     * price of one pack (and, when the column is there, its tax rate in %). Every problem is reported
     * with its row and column; the prices change in one transaction, or not at all.
     */
    async importPriceList(user: AuthUser, branchId: number, bytes: Buffer): Promise<SheetImportResult> {
      await branchOf(user, branchId);
      const sheet = await readSheet(bytes);
      const missing = requireColumns(sheet, PRICE_LIST_REQUIRED);
      if (missing.length > 0) throw invalidSheet(missing);
      if (sheet.rows.length === 0) throw invalidSheet([{ row: 2, message: 'the file has a header row but no prices' }]);
      const known = await repo.productsBySku(user.organisation.id);
      const hasTax = sheet.columns.includes('tax_rate');
      const problems: SheetProblem[] = [];
      const seen = new Map<string, number>();
      const changes: { productId: number; price: number; taxBp: number | null }[] = [];
      for (const r of sheet.rows) {
        const before = problems.length;
        const sku = textCell(r, 'sku', problems);
        const price = numberCell(r, 'price', problems, { decimals: priceDigits, max: 1_000_000, example: moneyEntryExample(config.currency) });
        const tax = hasTax ? numberCell(r, 'tax_rate', problems, { decimals: 2, required: false, max: 100 }) : null;
        let productId: number | undefined;
        if (sku !== null) {
          const p = known.get(sku.toLowerCase());
          if (!p) problems.push({ row: r.row, column: 'sku', message: `no product with the SKU "${sku}" in your catalogue: add the product first` });
          else if (p.archived_at) problems.push({ row: r.row, column: 'sku', message: `${sku} is archived: restore it before pricing it` });
          else productId = p.id;
          const first = seen.get(sku.toLowerCase());
          if (first !== undefined) problems.push({ row: r.row, column: 'sku', message: `${sku} is already priced on row ${first}` });
          else seen.set(sku.toLowerCase(), r.row);
        }
        if (problems.length === before && productId !== undefined && price !== null) {
          changes.push({ productId, price: Math.round(price * 10 ** priceDigits), taxBp: tax === null ? null : Math.round(tax * 100) });
        }
      }
      if (problems.length > 0) throw invalidSheet(problems);
      const warnings = sheet.columns
        .filter((c) => !['sku', 'name', 'category', 'unit', 'pack_size', 'pack_weight_kg', 'tax_rate', 'price'].includes(c))
        .map((c) => ({ code: 'unknown_column', message: `the column "${c}" is not part of a price list and was ignored` }));
      const counts = { added: 0, updated: 0, unchanged: 0 };
      await db.transaction(async (trx) => {
        for (const c of changes) {
          let outcome = await repo.setBranchPrice(trx, branchId, c.productId, c.price);
          const current = [...known.values()].find((k) => k.id === c.productId)!;
          if (c.taxBp !== null && c.taxBp !== current.tax_rate_bp) {
            await repo.updateProduct(trx, user.organisation.id, c.productId, { tax_rate_bp: c.taxBp });
            if (outcome === 'unchanged') outcome = 'updated';
          }
          counts[outcome]++;
        }
      });
      return { rows: sheet.rows.length, ...counts, warnings };
    },
  };
}

export type PriceListService = ReturnType<typeof priceListService>;
