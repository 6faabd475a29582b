import type { Pallet } from '../../../../shared/engine/delivery';
import { orderReference, type OrderSite } from '../../../../shared/schemas/order.schema';
import type { RoofSystem } from '../../../../shared/schemas/roof-system.schema';
import type { DriverDay, LandingFaceDrawing, RunStatus } from '../../../../shared/schemas/run.schema';
import { faceKey } from '../../../../shared/schemas/schedule.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import { orderCautions } from '../../estimates/cautions';
import type { OrderRow } from '../../orders/orders.repository';
import type { SlotRow } from '../../slots/slots.repository';
import { dropNotes, dropOrder, landingPlan, mapsUrl, palletContents, runCautions, shortFaces } from '../drop-sheet';
import { invalid, type DeliveryContext } from './delivery-context';

/** A run's stage from its drops and the yard's loading: all dropped, on the road once sent out, else how far it is loaded. */
function runStatus(statuses: string[], progress: { sent_out_at: string | null; loaded: number } | undefined, pallets: number): RunStatus {
  if (statuses.length > 0 && statuses.every((s) => s === 'delivered')) return 'done';
  if (progress?.sent_out_at || statuses.some((s) => s === 'on_the_road' || s === 'delivered')) return 'on_the_road';
  const loaded = progress?.loaded ?? 0;
  if (pallets > 0 && loaded >= pallets) return 'loaded';
  return loaded > 0 ? 'loading' : 'planned';
}

interface BookingWithOrder {
  id: number;
  order_id: number;
  slot_id: number;
  weight_kg: number;
  booked_at: string;
  plan: string | { pallets: Pallet[] };
  status: string;
  site: string;
  delivery_method: 'ground' | 'roof';
  notes: string;
  contractor_id: number;
  contractor_name: string;
  drop_position?: number | null;
}

/**
 * For a crane drop: the roof system of the order's estimate and, per face of the estimate (keyed by
 * building and face as the pallets name them), its shape from the schedule, the engine's figures and
 * its openings: what the phone needs to draw the stacks, since a driver may not read the estimate.
 */
async function landingDrawings(ctx: DeliveryContext, order: Pick<OrderRow, 'estimate_id' | 'contractor_organisation_id'>): Promise<{ system: RoofSystem; byFace: Map<string, LandingFaceDrawing> } | null> {
  const { estimates, schedules } = ctx;
  if (!order.estimate_id) return null;
  const e = await estimates.find(order.contractor_organisation_id, order.estimate_id);
  const schedule = e ? await schedules.findById(order.contractor_organisation_id, e.schedule_id) : undefined;
  if (!e || !schedule) return null;
  const byFace = new Map<string, LandingFaceDrawing>();
  for (const result of e.result.faces) {
    const key = faceKey(result.building, result.face);
    const shape = schedule.faces.find((f) => faceKey(f.building, f.face) === key);
    if (!shape) continue;
    byFace.set(`${result.building}\u0000${result.face}`, {
      shape: { eaves_mm: shape.eaves_mm, top_mm: shape.top_mm, rafter_mm: shape.rafter_mm, pitch_deg: shape.pitch_deg, left: shape.left, right: shape.right, top: shape.top },
      result,
      openings: schedule.openings.filter((o) => faceKey(o.building, o.face) === key).map(({ building, face, kind, width_mm, height_mm, quantity }) => ({ building, face, kind, width_mm, height_mm, quantity })),
    });
  }
  return { system: e.system_input, byFace };
}

async function lorryOf(ctx: DeliveryContext, run: SlotRow) {
  const l = await ctx.repo.deck(run.lorry_id);
  return {
    id: run.lorry_id,
    registration: run.registration,
    name: run.lorry_name,
    has_crane: run.has_crane,
    crane_max_kg: run.crane_max_kg,
    payload_kg: run.payload_kg,
    pallet_slots: run.pallet_slots,
    // Deck size where the fleet keeps it; a rigid's usual 7.3 m × 2.45 m bed until then.
    deck_length_mm: Number(l?.deck_length_mm ?? 7300),
    deck_width_mm: Number(l?.deck_width_mm ?? 2450),
  };
}

async function dayRuns(ctx: DeliveryContext, orgId: number, runs: SlotRow[], readerId: number): Promise<DriverDay['runs']> {
  const { repo, slots, orders } = ctx;
  const bookings = (await slots.bookingsOfSlots(runs.map((r) => r.id))) as BookingWithOrder[];
  const progress = await repo.runProgress(runs.map((r) => r.id));
  const reads = await repo.cautionReads(
    runs.map((r) => r.id),
    readerId,
  );
  const out: DriverDay['runs'] = [];
  for (const run of runs) {
    const drops: DriverDay['runs'][number]['drops'] = [];
    const cautions: string[][] = [];
    for (const [i, b] of dropOrder(bookings.filter((x) => x.slot_id === run.id)).entries()) {
      const site = JSON.parse(b.site) as OrderSite;
      const order = (await orders.find({ kind: 'merchant', organisationId: orgId }, b.order_id))!;
      const lines = await orders.lines(b.order_id);
      const plan = (typeof b.plan === 'string' ? JSON.parse(b.plan) : b.plan) as { pallets: Pallet[] };
      const pallets = [...plan.pallets].sort((a, c) => a.n - c.n);
      const contents = palletContents(pallets, lines);
      const faces = await ctx.estimateFaces(order);
      const short = shortFaces(faces, pallets, lines, lines.some((l) => l.back_order_quantity > 0) ? await ctx.followUpOf(b.order_id) : null);
      cautions.push(orderCautions(b.delivery_method, site));
      const drawings = b.delivery_method === 'roof' ? await landingDrawings(ctx, order) : null;
      const landing = b.delivery_method === 'roof' ? landingPlan(faces, pallets).map((f) => ({ ...f, drawing: drawings?.byFace.get(`${f.building}\u0000${f.face}`) ?? null })) : [];
      drops.push({
        order_id: b.order_id,
        reference: orderReference(b.order_id),
        position: i + 1,
        status: b.status,
        contractor: { id: b.contractor_id, name: b.contractor_name },
        site,
        maps_url: mapsUrl(site),
        delivery_method: b.delivery_method,
        weight_kg: Number(b.weight_kg),
        pallets: pallets.map((p, k) => ({ n: p.n, weight_kg: p.weight_kg, faces: p.faces, items: contents[k] })),
        lines: lines
          .filter((l) => l.reserved_quantity > 0 || l.delivered_quantity !== null)
          .map((l) => ({ line_id: l.id, sku: l.sku, description: l.description, unit: l.unit, quantity: l.reserved_quantity > 0 ? l.reserved_quantity : (l.delivered_quantity ?? 0) })),
        notes: dropNotes(b.delivery_method, site, b.notes ?? ''),
        short_faces: short,
        landing_plan: landing,
        roof_system: drawings && landing.some((f) => f.drawing !== null) ? drawings.system : null,
        estimate_id: order.estimate_id,
        delivered: b.status === 'delivered',
      });
    }
    out.push({
      id: run.id,
      date: run.date,
      time_window: run.time_window,
      lorry: await lorryOf(ctx, run),
      status: runStatus(
        drops.map((d) => d.status),
        progress.get(run.id),
        drops.reduce((s, d) => s + d.pallets.length, 0),
      ),
      cautions: runCautions(cautions),
      cautions_read_at: reads.get(run.id) ?? null,
      drops,
    });
  }
  return out;
}

/** The runs of one driver on one day (the signed-in driver's own; the owner or dispatcher names one). */
export async function driverDay(ctx: DeliveryContext, user: AuthUser, q: { date?: string; driver_id?: number }): Promise<DriverDay> {
  const { slots, fleet } = ctx;
  const date = q.date ?? ctx.deps.config.calendar.today();
  let driverId: number;
  if (user.role === 'driver') {
    if (q.driver_id !== undefined && q.driver_id !== user.id) throw AppError.forbidden('A driver sees only their own runs');
    driverId = user.id;
  } else {
    if (!q.driver_id) throw invalid([{ path: 'driver_id', message: 'name the driver whose day you want' }]);
    driverId = q.driver_id;
  }
  const driver = await fleet.driver(user.organisation.id, driverId);
  if (!driver) throw AppError.notFound('Driver');
  const runs = await slots.forDriver(user.organisation.id, driverId, date);
  return { date, driver: { id: driver.id, name: driver.name }, runs: await dayRuns(ctx, user.organisation.id, runs, driverId) };
}

/** The run's driver records having read its cautions; the first reading's time stands. */
export async function readCautions(ctx: DeliveryContext, user: AuthUser, runId: number) {
  const { slots, repo } = ctx;
  const run = await slots.find(user.organisation.id, runId);
  if (!run) throw AppError.notFound('Run');
  if (user.role !== 'driver' || run.driver_user_id !== user.id) {
    if (user.role === 'driver') throw AppError.notFound('Run');
    throw AppError.forbidden("Only the run's driver acknowledges its cautions");
  }
  const at = await repo.readCautions(run.id, { id: user.id, name: user.name });
  return { run_id: run.id, read_at: at, read_by: { id: user.id, name: user.name } };
}
