import { checkFacesAgainstSystem, estimate } from '../../../shared/engine/estimate';
import { lowestPitch } from '../../../shared/engine/courses';
import { parseRoofSystem } from '../../../shared/engine/roof-system';
import { CATEGORY_LABELS, SYSTEM_ROLES, type SystemRole } from '../../../shared/schemas/catalogue.schema';
import type { SubstituteFigures, SubstituteOption } from '../../../shared/schemas/order.schema';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';
import type { Db } from '../../db/knex';
import type { BranchProductRow } from '../catalogue/catalogue.repository';
import { billOfMaterials, packsFor, type BillLine, type PricedComponent } from '../estimates/bill-of-materials';
import { estimatesRepository } from '../estimates/estimates.repository';
import { engineFace } from '../../../shared/domain/stored-schedule';
import { schedulesRepository } from '../schedules/schedules.repository';
import type { OrderRow, StoredOrderLine } from './orders.repository';

const isRole = (c: string): c is SystemRole => (SYSTEM_ROLES as readonly string[]).includes(c);

/** The order's own products and pack prices per role of the roof system (substitute lines left out). */
function orderComponents(lines: readonly StoredOrderLine[]): Map<SystemRole, PricedComponent> {
  const out = new Map<SystemRole, PricedComponent>();
  for (const l of lines) {
    if (l.status === 'substitute' || !isRole(l.category) || out.has(l.category)) continue;
    out.set(l.category, { product: { id: l.product_id, sku: l.sku, name: l.description, unit: l.unit, pack_size: l.pack_size }, pack_price: l.unit_price });
  }
  return out;
}

const item = (l: BillLine) => ({ product_id: l.product_id, sku: l.sku, description: l.description, quantity: l.quantity, unit: l.unit, packs: l.packs, unit_price: l.unit_price, total: l.total });

/**
 * Works out a substitute tile on the order's own roof with the engine as it stands: the schedule and
 * roof system of the estimate the order came from, with the tile swapped, priced with the order's own
 * products and the substitute's price. Both bills are worked out now, so a difference comes from the
 * tile alone (not from a change to the engine since the estimate was made). Faces below the tile's
 * lowest pitch are listed as refused and left out of both bills.
 */
export async function substituteTileFigures(
  db: Db,
  order: Pick<OrderRow, 'contractor_organisation_id' | 'estimate_id'>,
  lines: readonly StoredOrderLine[],
  sub: Pick<BranchProductRow, 'id' | 'sku' | 'name' | 'unit' | 'pack_size' | 'technical'>,
  unitPrice: number,
): Promise<{ ok: true; figures: SubstituteFigures; packs: number } | { ok: false; reason: string }> {
  if (order.estimate_id === null) return { ok: false, reason: 'the order has no estimate, so there is no roof to work the tile out on' };
  const est = await estimatesRepository(db).find(order.contractor_organisation_id, order.estimate_id);
  if (!est) return { ok: false, reason: 'the estimate the order came from is no longer there' };
  const schedule = await schedulesRepository(db).findById(order.contractor_organisation_id, est.schedule_id);
  if (!schedule) return { ok: false, reason: 'the schedule the order came from is no longer there' };
  const parsed = parseRoofSystem({ ...est.system_input, tile: sub.technical });
  if (!parsed.ok) return { ok: false, reason: `${sub.sku} lacks the tile figures the engine needs (${parsed.errors.map((e) => `${e.field ?? ''} ${e.message}`.trim()).join('; ')})` };
  const before: RoofSystem = est.system_input;
  const after = parsed.system;

  const faces = schedule.faces.map(engineFace);
  const refusedRows = new Set(checkFacesAgainstSystem(faces, after).map((p) => (p.row ?? 0) - 1));
  const low = lowestPitch(after.tile.headlap_mm);
  const refused = faces
    .filter((_, i) => refusedRows.has(i))
    .map((f) => ({ building: f.building, face: f.face, pitch_deg: f.pitch_deg, message: `${f.building} ${f.face}: ${f.pitch_deg}° is below the lowest pitch ${sub.sku} may be laid at (${low}°)` }));
  const suited = faces.filter((_, i) => !refusedRows.has(i));
  if (suited.length === 0) {
    return { ok: false, reason: `${sub.sku} may not be laid on any face of this roof: ${refused.map((r) => r.message).join('; ')}` };
  }

  const components = orderComponents(lines);
  const subComponents = new Map(components);
  subComponents.set('tile', { product: { id: sub.id, sku: sub.sku, name: sub.name, unit: sub.unit, pack_size: sub.pack_size }, pack_price: unitPrice });
  let beforeBill: ReturnType<typeof billOfMaterials>;
  let afterBill: ReturnType<typeof billOfMaterials>;
  let engineVersion: string;
  try {
    const beforeResult = estimate(
      suited.filter((f) => checkFacesAgainstSystem([f], before).length === 0),
      before,
    );
    const afterResult = estimate(suited, after);
    beforeBill = billOfMaterials(beforeResult, before, components);
    afterBill = billOfMaterials(afterResult, after, subComponents);
    engineVersion = afterResult.engine_version;
  } catch (e) {
    return { ok: false, reason: `the engine could not work the roof out with ${sub.sku}: ${(e as Error).message}` };
  }

  const roles = [...new Set([...beforeBill.lines, ...afterBill.lines].map((l) => l.category))];
  const rows = roles.map((role) => {
    const b = beforeBill.lines.find((l) => l.category === role);
    const a = afterBill.lines.find((l) => l.category === role);
    const changes = !b || !a || b.product_id !== a.product_id || b.packs !== a.packs || b.total !== a.total;
    return { role, label: CATEGORY_LABELS[role], before: b ? item(b) : null, after: a ? item(a) : null, changes };
  });
  const beforeTotal = beforeBill.lines.reduce((s, l) => s + (l.total ?? 0), 0);
  const afterTotal = afterBill.lines.reduce((s, l) => s + (l.total ?? 0), 0);
  const tileLine = afterBill.lines.find((l) => l.category === 'tile');
  return {
    ok: true,
    packs: tileLine?.packs ?? 0,
    figures: {
      engine_version: engineVersion,
      tile: { sku: sub.sku, description: sub.name, kind: after.tile.kind, lowest_pitch_deg: low },
      refused_faces: refused,
      rows,
      not_counted: afterBill.not_counted.map((n) => n.message),
      before_total: beforeTotal,
      after_total: afterTotal,
      price_difference_minor: afterTotal - beforeTotal,
    },
  };
}

/**
 * The products the desk may offer instead of a line: the branch's others of the same kind. A tile
 * comes with the engine's figures for the order's roof and is offered only if it suits every face;
 * anything else keeps its pack arithmetic (the same quantity in the substitute's pack size).
 */
export async function substituteOptions(
  db: Db,
  order: Pick<OrderRow, 'contractor_organisation_id' | 'estimate_id'>,
  lines: readonly StoredOrderLine[],
  line: StoredOrderLine,
  candidates: readonly BranchProductRow[],
): Promise<SubstituteOption[]> {
  const options: SubstituteOption[] = [];
  for (const p of candidates) {
    if (p.id === line.product_id) continue;
    const base = { product_id: p.id, sku: p.sku, name: p.name, unit: p.unit, pack_size: p.pack_size, pack_price: p.pack_price, available: Math.max(0, p.on_hand - p.reserved) };
    if (line.category !== 'tile') {
      options.push({ ...base, quantity: packsFor(line.quantity * line.pack_size, p.pack_size), suitable: true, reason: null, figures: null });
      continue;
    }
    const worked = await substituteTileFigures(db, order, lines, p, p.pack_price);
    if (!worked.ok) {
      options.push({ ...base, quantity: 0, suitable: false, reason: worked.reason, figures: null });
      continue;
    }
    const refused = worked.figures.refused_faces;
    options.push({
      ...base,
      quantity: worked.packs,
      suitable: refused.length === 0,
      reason: refused.length === 0 ? null : `not for this roof: ${refused.map((r) => r.message).join('; ')}`,
      figures: worked.figures,
    });
  }
  return options;
}
