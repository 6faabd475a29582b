import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import type { z } from 'zod';
import { addDays } from '../../../shared/domain/business-calendar';
import { can } from '../../../shared/domain/policy';
import { deckPalletKey, planDeck, type DeckDrop, type DeckPlan } from '../../../shared/engine/deck-plan';
import { CATEGORY_LABELS, type ProductCategory } from '../../../shared/schemas/catalogue.schema';
import { ORDER_TRANSITIONS, orderReference, stageAllows } from '../../../shared/schemas/order.schema';
import type { PalletView, Run, RunStatus, RunWeek, sendOutBodySchema } from '../../../shared/schemas/run.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { peekRow } from '../../db/knex';
import { AppError } from '../../http/app-error';
import { sendOrderMail } from '../orders/order-mail';
import { ordersRepository } from '../orders/orders.repository';
import { priceListRepository } from '../price-list/price-list.repository';
import { runsRepository, type DropRow, type PickRow, type RunRow } from './runs.repository';

type SendOutBody = z.output<typeof sendOutBodySchema>;

/** A run with what the documents need beside the API's shape: each drop's site and the deck's geometry. */
export interface RunDetail {
  run: Run;
  row: RunRow;
  drops: DropRow[];
  deck: DeckPlan;
  /** Each drop's product names by category, to name what is on its pallets. */
  names: Map<number, ProductNames>;
}

const round1 = (v: number) => Math.round(v * 10) / 10;
const SHORT_LINE = new Set(['part_agreed', 'back_ordered']);

function invalid(path: string, message: string): AppError {
  return AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);
}

function runStatus(row: RunRow, drops: DropRow[], pallets: number, loaded: number): RunStatus {
  if (drops.length > 0 && drops.every((d) => d.status === 'delivered')) return 'done';
  if (row.sent_out_at || drops.some((d) => d.status === 'on_the_road' || d.status === 'delivered')) return 'on_the_road';
  if (pallets > 0 && loaded === pallets) return 'loaded';
  if (loaded > 0) return 'loading';
  return 'planned';
}

/** Builds runs (with their deck plans and pick lists) from the rows of several runs at once. */
async function assemble(repo: ReturnType<typeof runsRepository>, rows: RunRow[], trx?: Db): Promise<RunDetail[]> {
  const ids = rows.map((r) => r.id);
  const [drops, loaded] = await Promise.all([repo.drops(ids, trx), repo.loaded(ids, trx)]);
  const orderIds = drops.map((d) => d.order_id);
  const [picks, footprints] = await Promise.all([repo.pickLines(orderIds, trx), repo.footprints(orderIds, trx)]);
  const dropsOf = new Map<number, DropRow[]>();
  for (const d of drops) dropsOf.set(d.slot_id, [...(dropsOf.get(d.slot_id) ?? []), d]);
  const loadedOf = new Map<number, Set<string>>();
  for (const l of loaded) {
    const set = loadedOf.get(l.slot_id) ?? new Set<string>();
    set.add(deckPalletKey(l.order_id, l.pallet));
    loadedOf.set(l.slot_id, set);
  }
  const picksOf = new Map<number, PickRow[]>();
  for (const p of picks) picksOf.set(p.order_id, [...(picksOf.get(p.order_id) ?? []), p]);

  return rows.map((row) => {
    const runDrops = dropsOf.get(row.id) ?? [];
    const deckDrops: DeckDrop[] = runDrops.map((d) => {
      const fp = footprints.get(d.order_id);
      return {
        order_id: d.order_id,
        reference: orderReference(d.order_id),
        delivery_method: d.delivery_method,
        pallets: d.plan.pallets.map((p) => ({ n: p.n, weight_kg: p.weight_kg, faces: p.faces, ...(p.kind === 'tiles' && fp ? { length_mm: fp.length_mm, width_mm: fp.width_mm } : {}) })),
      };
    });
    const deck = planDeck(row, deckDrops, loadedOf.get(row.id));
    const pallets = deck.positions.length;
    const loadedCount = deck.positions.filter((p) => p.loaded).length;
    const { geometry: _geometry, ...deckOut } = deck;
    void _geometry;
    const run: Run = {
      id: row.id,
      branch_id: row.branch_id,
      date: row.date,
      time_window: row.time_window,
      lorry: {
        id: row.lorry_id,
        registration: row.registration,
        name: row.lorry_name,
        has_crane: row.has_crane,
        crane_max_kg: row.crane_max_kg,
        payload_kg: row.payload_kg,
        pallet_slots: row.pallet_slots,
        deck_length_mm: row.deck_length_mm,
        deck_width_mm: row.deck_width_mm,
      },
      driver: row.driver_user_id ? { id: row.driver_user_id, name: row.driver_name ?? '' } : null,
      status: runStatus(row, runDrops, pallets, loadedCount),
      dispatched_at: row.sent_out_at,
      weight_kg: round1(runDrops.reduce((s, d) => s + d.weight_kg, 0)),
      pallets,
      loaded_count: loadedCount,
      drops: runDrops.map((d, i) => {
        const lines = picksOf.get(d.order_id) ?? [];
        return {
          order_id: d.order_id,
          reference: orderReference(d.order_id),
          position: i + 1,
          pallets: d.plan.pallets.length,
          weight_kg: d.weight_kg,
          status: d.status,
          contractor: { id: d.contractor_id, name: d.contractor_name },
          site_name: d.site_name,
          site_address: d.site.site_address,
          site_postcode: d.site.site_postcode,
          delivery_method: d.delivery_method,
          short: lines.some((l) => l.back_order_quantity > 0 || SHORT_LINE.has(l.status)),
        };
      }),
      deck: deckOut,
      pick_list: runDrops.map((d) => ({
        order_id: d.order_id,
        reference: orderReference(d.order_id),
        lines: (picksOf.get(d.order_id) ?? [])
          .filter((l) => l.reserved_quantity > 0)
          .map((l) => ({ sku: l.sku, description: l.description, unit: l.unit, quantity: l.reserved_quantity * l.pack_size, packs: l.pack_size > 1 ? l.reserved_quantity : null })),
      })),
    };
    const names = new Map<number, ProductNames>();
    for (const d of runDrops) {
      const m = new Map<string, { description: string; unit: string }>();
      for (const l of picksOf.get(d.order_id) ?? []) if (!m.has(l.category)) m.set(l.category, { description: l.description, unit: l.unit });
      names.set(d.order_id, m);
    }
    return { run, row, drops: runDrops, deck, names };
  });
}

export function runsService(deps: Pick<AppDeps, 'db' | 'config' | 'mailer' | 'logger'>) {
  const { db, config } = deps;
  const repo = runsRepository(db);
  const orders = ordersRepository(db);
  const branches = priceListRepository(db);
  const today = () => config.calendar.today();
  /**
   * Day plans, already serialised, filed under the merchant's two change counters (runs and order
   * book, both kept by triggers): the yard's board asks for the same day again and again, and it
   * changes only when something on it is written. Read only outside a transaction (see peekRow).
   */
  const days = new LRUCache<string, { body: Buffer; etag: string }>({ max: 200 });
  const versions = (orgId: number): string | null => {
    const run = peekRow<{ version: number }>(db, 'select version from run_versions where organisation_id = ?', orgId);
    const book = peekRow<{ version: number }>(db, 'select version from order_book_versions where organisation_id = ?', orgId);
    if (!run || !book) return null;
    return `${run.row?.version ?? 0}.${book.row?.version ?? 0}`;
  };

  async function branchOf(user: AuthUser, branchId: number) {
    if (user.organisation.kind !== 'merchant' || !(await branches.branch(user.organisation.id, branchId))) throw AppError.notFound('Branch');
  }

  /** The run, if the user may see it: the merchant's own, and for a driver only a run assigned to them. */
  async function runOf(user: AuthUser, id: number, trx: Db = db): Promise<RunRow> {
    const row = user.organisation.kind === 'merchant' ? await repo.find(user.organisation.id, id, trx) : undefined;
    if (!row) throw AppError.notFound('Run');
    if (user.role === 'driver' && row.driver_user_id !== user.id) throw AppError.forbidden('A driver sees only the runs assigned to them');
    return row;
  }

  async function detail(user: AuthUser, id: number, trx?: Db): Promise<RunDetail> {
    return (await assemble(repo, [await runOf(user, id, trx)], trx))[0];
  }

  /**
   * The rules for a run (or some of its orders) to leave the yard: its day is today in the business
   * calendar and every pallet of those orders is ticked loaded. 409 not_today / not_loaded otherwise.
   */
  function readiness(d: RunDetail, orderIds: readonly number[]): { code: 'not_today' | 'not_loaded'; message: string } | null {
    if (d.row.date !== today()) {
      return { code: 'not_today', message: `${d.row.registration}'s run is on ${d.row.date}; today is ${today()}: it goes out on its day` };
    }
    const missing = d.deck.positions.filter((p) => orderIds.includes(p.order_id) && !p.loaded);
    if (missing.length > 0) {
      const names = missing.slice(0, 6).map((p) => `pallet ${p.pallet} of ${orderReference(p.order_id)}`);
      return { code: 'not_loaded', message: `${missing.length} pallet${missing.length === 1 ? ' is' : 's are'} not ticked loaded: ${names.join(', ')}${missing.length > 6 ? ', …' : ''}` };
    }
    return null;
  }

  return {
    async day(user: AuthUser, branchId: number, date: string): Promise<Run[]> {
      await branchOf(user, branchId);
      const rows = await repo.between(user.organisation.id, branchId, date, date, user.role === 'driver' ? user.id : undefined);
      return (await assemble(repo, rows)).map((d) => d.run);
    },

    /** The day plan as JSON bytes with their ETag, from memory while nothing on it has changed. */
    async dayJson(user: AuthUser, branchId: number, date: string): Promise<{ body: Buffer; etag: string }> {
      const version = user.organisation.kind === 'merchant' ? versions(user.organisation.id) : null;
      const key = version ? `${user.organisation.id}:${branchId}:${date}:${user.role === 'driver' ? user.id : ''}:${version}` : null;
      const kept = key ? days.get(key) : undefined;
      if (kept !== undefined) return kept;
      const body = Buffer.from(JSON.stringify(await this.day(user, branchId, date)), 'utf8');
      const json = { body, etag: `W/"${body.length.toString(16)}-${createHash('sha1').update(body).digest('base64').slice(0, 27)}"` };
      if (key) days.set(key, json);
      return json;
    },

    async get(user: AuthUser, id: number): Promise<Run> {
      return (await detail(user, id)).run;
    },

    detail,

    async week(user: AuthUser, branchId: number, from: string): Promise<RunWeek> {
      await branchOf(user, branchId);
      const to = addDays(from, 6);
      const rows = await repo.between(user.organisation.id, branchId, from, to, user.role === 'driver' ? user.id : undefined);
      const runs = await assemble(repo, rows);
      const days: RunWeek['days'] = [];
      for (let d = from; d <= to; d = addDays(d, 1)) {
        days.push({
          date: d,
          runs: runs
            .filter((r) => r.run.date === d)
            .map(({ run }) => ({
              id: run.id,
              time_window: run.time_window,
              lorry: { id: run.lorry.id, registration: run.lorry.registration, has_crane: run.lorry.has_crane },
              driver: run.driver,
              drops: run.drops.length,
              weight_kg: run.weight_kg,
              pallets: run.pallets,
              loaded_count: run.loaded_count,
              status: run.status,
            })),
        });
      }
      return { from, days };
    },

    /** Sets the drop order: the list must name every drop of the run once. */
    async setDrops(user: AuthUser, id: number, orderIds: number[]): Promise<Run> {
      await db.transaction(async (trx) => {
        const row = await runOf(user, id, trx);
        if (row.sent_out_at) throw AppError.conflict('run_sent_out', `${row.registration}'s run has left the yard: its drop order no longer changes`);
        const drops = await repo.drops([row.id], trx);
        const ids = new Set(drops.map((d) => d.order_id));
        const seen = new Set<number>();
        const problems: { path: string; message: string }[] = [];
        orderIds.forEach((oid, i) => {
          if (!ids.has(oid)) problems.push({ path: `order_ids.${i}`, message: `${orderReference(oid)} is not a drop of this run` });
          else if (seen.has(oid)) problems.push({ path: `order_ids.${i}`, message: `${orderReference(oid)} is named twice` });
          seen.add(oid);
        });
        const missing = [...ids].filter((oid) => !seen.has(oid));
        if (missing.length > 0) problems.push({ path: 'order_ids', message: `must name every drop of the run once; missing ${missing.map(orderReference).join(', ')}` });
        if (problems.length > 0) throw AppError.unprocessable('validation_failed', 'The drop order is not valid', problems);
        await repo.setDropOrder(trx, row.id, orderIds);
      });
      return (await detail(user, id)).run;
    },

    /** Ticks (or unticks) the pallet at an index of the run's deck positions. */
    async setLoaded(user: AuthUser, id: number, index: number, loaded: boolean): Promise<Run> {
      const d = await detail(user, id);
      if (d.row.sent_out_at) throw AppError.conflict('run_sent_out', `${d.row.registration}'s run has left the yard`);
      const p = d.deck.positions[index];
      if (!p) throw invalid('index', d.deck.positions.length === 0 ? 'the run has no pallets' : `must be a position of the deck, 0 to ${d.deck.positions.length - 1}`);
      if (loaded) await repo.markLoaded(d.row.id, p.order_id, p.pallet, user.id);
      else await repo.unmarkLoaded(d.row.id, p.order_id, p.pallet);
      return (await detail(user, id)).run;
    },

    /**
     * Sends the run out: every confirmed drop goes on the road in one transaction. Refused (409) before
     * its day or with a pallet not loaded, unless a dispatcher or the owner overrides with a reason,
     * which goes on each order's timeline.
     */
    async sendOut(user: AuthUser, id: number, body: SendOutBody): Promise<Run> {
      const t = ORDER_TRANSITIONS.dispatch;
      const sent: number[] = [];
      await db.transaction(async (trx) => {
        const d = await detail(user, id, trx);
        if (d.row.sent_out_at) throw AppError.conflict('run_sent_out', `${d.row.registration}'s run left the yard at ${d.row.sent_out_at}`);
        const going = d.drops.filter((x) => stageAllows('dispatch', x.status)).map((x) => x.order_id);
        if (going.length === 0) throw AppError.conflict('nothing_to_send', `${d.row.registration}'s run has no confirmed drop to send out`);
        if (!d.row.driver_user_id) throw AppError.conflict('no_driver', `Assign a driver to ${d.row.registration} on ${d.row.date} ${d.row.time_window} first`);
        const refusal = readiness(d, going);
        if (refusal && !body.override_reason) throw AppError.conflict(refusal.code, refusal.message);
        if (refusal && !can(user.role, 'runs:override')) throw AppError.forbidden('Only a dispatcher or the merchant owner may send a run out against the rules');
        const override = refusal ? body.override_reason! : null;
        const actor = { userId: user.id, name: user.name, organisationId: user.organisation.id };
        for (const orderId of going) {
          if (!(await orders.updateIf(trx, orderId, { statuses: t.from }, { status: t.to }, false)))
            throw AppError.conflict('order_changed', `${orderReference(orderId)} changed at the same moment; reload the run and try again`);
          await orders.insertEvent(trx, orderId, {
            kind: 'dispatched',
            actor,
            summary: `Out for delivery on ${d.row.registration} with ${d.row.driver_name}`,
            data: { slot_id: d.row.id },
          });
          if (override && refusal) {
            await orders.insertEvent(trx, orderId, {
              kind: 'send_out_override',
              actor,
              summary: `Sent out against the rule (${refusal.code === 'not_today' ? 'not its day' : 'not every pallet ticked loaded'}): ${override}`,
              data: { slot_id: d.row.id, rule: refusal.code, reason: override },
            });
          }
          sent.push(orderId);
        }
        await repo.markSentOut(trx, d.row.id, { by: user.id, override });
        const party = { kind: 'merchant' as const, organisationId: user.organisation.id };
        for (const orderId of sent) {
          const order = await orders.find(party, orderId, trx);
          if (!order) continue;
          const contractor = await orders.contractorEmails(order, trx);
          const desk = await orders.deskEmails(order.merchant_organisation_id, trx);
          await sendOrderMail(trx, deps, 'dispatched', order, { contractor, desk }, undefined, { date: d.row.date, time_window: d.row.time_window, registration: d.row.registration }, 'merchant');
        }
      });
      return (await detail(user, id)).run;
    },

    /**
     * For the per-order dispatch: the same rules as the run's send-out, for that order's pallets. An
     * order not booked on a run is left to the caller's own rule.
     */
    async assertOrderMayLeave(user: AuthUser, orderId: number, trx: Db): Promise<void> {
      const b = await repo.bookingOf(orderId, trx);
      if (!b) return;
      const row = await repo.find(user.organisation.id, b.slot_id, trx);
      if (!row) return;
      const d = (await assemble(repo, [row], trx))[0];
      const refusal = readiness(d, [orderId]);
      if (refusal) throw AppError.conflict(refusal.code, `${refusal.message}. A dispatcher may send the whole run out with a reason.`);
    },

    /** One pallet as its label's QR code opens it. */
    async pallet(user: AuthUser, orderId: number, n: number): Promise<PalletView> {
      if (user.organisation.kind !== 'merchant') throw AppError.notFound('Order');
      const order = await orders.find({ kind: 'merchant', organisationId: user.organisation.id }, orderId);
      if (!order) throw AppError.notFound('Order');
      const b = await repo.bookingOf(orderId);
      if (!b) throw AppError.conflict('not_booked', `${orderReference(orderId)} is not booked onto a run: it has no pallets yet`);
      const d = await detail(user, b.slot_id);
      const drop = d.drops.findIndex((x) => x.order_id === orderId);
      const plan = d.drops[drop].plan.pallets;
      const pallet = plan.find((p) => p.n === n);
      if (!pallet) throw AppError.notFound('Pallet');
      const index = d.deck.positions.findIndex((p) => p.order_id === orderId && p.pallet === n);
      return {
        order_id: orderId,
        reference: orderReference(orderId),
        site_name: order.site_name,
        pallet: n,
        pallets: plan.length,
        drop: drop + 1,
        drops: d.drops.length,
        run_id: d.row.id,
        position_index: index >= 0 ? index : null,
        weight_kg: pallet.weight_kg,
        faces: pallet.faces,
        items: palletItems(pallet, d.names.get(orderId)),
        loaded: index >= 0 ? d.deck.positions[index].loaded : false,
      };
    },
  };
}

/** The category of the order line each of the engine's pallet items comes from. */
const ITEM_CATEGORY: Record<string, string> = {
  underlay_rolls: 'underlay',
  battens: 'batten',
  batten_nails: 'batten_nail',
  tile_nails: 'tile_nail',
  clips: 'clip',
  ridge_tiles: 'ridge',
  hip_tiles: 'hip',
};

export type ProductNames = ReadonlyMap<string, { description: string; unit: string }>;

const plural = (unit: string, n: number) => (n === 1 || /(s|m|kg)$/.test(unit) ? unit : `${unit}s`);

/** What is on a pallet, in words: the order's own product names and units, never the engine's item keys. */
export function palletItems(p: { kind: string; tiles: number; items: ReadonlyArray<{ item: string; quantity: number }> }, names: ProductNames = new Map()): PalletView['items'] {
  if (p.kind === 'tiles') {
    const tile = names.get('tile');
    return [{ description: tile?.description ?? 'Roof tiles', quantity: p.tiles, unit: plural(tile?.unit ?? 'tile', p.tiles) }];
  }
  return p.items.map((it) => {
    const category = ITEM_CATEGORY[it.item] ?? it.item;
    const known = names.get(category);
    const label = CATEGORY_LABELS[category as ProductCategory] ?? category.replace(/_/g, ' ');
    return { description: known?.description ?? label, quantity: it.quantity, unit: plural(known?.unit ?? 'unit', it.quantity) };
  });
}

export type RunsService = ReturnType<typeof runsService>;
