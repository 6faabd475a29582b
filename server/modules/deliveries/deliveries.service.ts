import type { Pallet } from '../../../shared/engine/delivery';
import { ORDER_STATUS_LABELS, ORDER_TRANSITIONS, orderReference, type OrderSite } from '../../../shared/schemas/order.schema';
import type { RoofSystem } from '../../../shared/schemas/roof-system.schema';
import type { CreditNoteDraft, DeliveryProof, DriverDay, LandingFaceDrawing, RunStatus } from '../../../shared/schemas/run.schema';
import { faceKey } from '../../../shared/schemas/schedule.schema';
import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import { AppError } from '../../http/app-error';
import { enqueueMail, type AttachmentRef } from '../../mail/outbox';
import { renderEmail } from '../../mail/templates';
import { orderCautions } from '../estimates/cautions';
import { estimatesRepository } from '../estimates/estimates.repository';
import { fleetRepository } from '../fleet/fleet.repository';
import { lineTax } from '../invoices/invoices.service';
import { sendOrderMail } from '../orders/order-mail';
import { ordersService } from '../orders/orders.service';
import { ordersRepository, type OrderParty, type OrderRow, type StoredOrderLine } from '../orders/orders.repository';
import { schedulesRepository } from '../schedules/schedules.repository';
import { slotsRepository, type SlotRow } from '../slots/slots.repository';
import { stockRepository } from '../stock/stock.repository';
import { deliveriesRepository, type DraftLine, type ProofLineRow } from './deliveries.repository';
import { deliveryNotePdf } from './delivery-note';
import { dropNotes, dropOrder, landingPlan, mapsUrl, palletContents, runCautions, shortFaces, type EstimateFace } from './drop-sheet';
import type { ProofFile } from './proof-files';

/** A delivery record after the JSON or multipart body is read (and an older body with delivered_quantity turned into this). */
export interface DeliveryRecord {
  receiver_name: string;
  note: string;
  delivered_at?: string;
  /** short null: the packs not handed over or damaged are short (the older body's meaning). */
  lines?: { line_id: number; handed_over: number; short: number | null; damaged: number }[];
  position?: { lat: number; lng: number; accuracy_m?: number };
}

const partyOf = (user: AuthUser): OrderParty => ({ kind: user.organisation.kind, organisationId: user.organisation.id });
const invalid = (problems: { path: string; message: string }[], message = 'Some fields are not valid') => AppError.unprocessable('validation_failed', message, problems);
const proofBase = (orderId: number) => `/api/orders/${orderId}/delivery`;

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
 * The driver's side of a delivery: the day's runs with their drops in order, the cautions once per
 * run and their acknowledgement, the proof of delivery (receiver, signature, photos, per line what was
 * handed over, short or damaged), the draft credit note it raises, and the delivery note.
 */
/** How a draft becomes a credit note: the invoices module's own credit step (numbering, refunds). */
export type IssueCredit = (user: AuthUser, invoiceId: number, body: { reason: 'shortage' | 'damage'; notes?: string; lines: { invoice_line_id: number; quantity: number }[] }) => Promise<unknown>;

/** The outbox's name for a delivery note attached by reference. */
export const DELIVERY_NOTE_ATTACHMENT = 'delivery-note';

export function deliveriesService(deps: Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>, issueCredit?: IssueCredit) {
  const { db, config } = deps;
  const repo = deliveriesRepository(db);
  const orders = ordersRepository(db);
  const slots = slotsRepository(db);
  const fleet = fleetRepository(db);
  const estimates = estimatesRepository(db);
  const schedules = schedulesRepository(db);
  const stock = stockRepository(db);
  const orderDetails = ordersService(deps);

  /**
   * The order as this person may see its delivery: the merchant's desk and yard, the driver of the
   * run it is booked on, and the contractor who ordered it. Anything else is "not found".
   */
  async function orderFor(user: AuthUser, orderId: number, trx: Db = db): Promise<OrderRow> {
    const order = await orders.find(partyOf(user), orderId, trx);
    if (!order) throw AppError.notFound('Order');
    if (user.role === 'driver') {
      const booking = await slots.booking(orderId, trx);
      const slot = booking ? await slots.find(user.organisation.id, booking.slot_id, trx) : undefined;
      if (slot?.driver_user_id !== user.id) throw AppError.notFound('Order');
    }
    return order;
  }

  async function estimateFaces(order: Pick<OrderRow, 'estimate_id' | 'contractor_organisation_id'>): Promise<EstimateFace[]> {
    if (!order.estimate_id) return [];
    const e = await estimates.find(order.contractor_organisation_id, order.estimate_id);
    return (e?.result.faces ?? []).map((f) => ({ building: f.building, face: f.face, tiles: f.tiles, quantity: f.quantity }));
  }

  /**
   * For a crane drop: the roof system of the order's estimate and, per face of the estimate (keyed by
   * building and face as the pallets name them), its shape from the schedule, the engine's figures and
   * its openings: what the phone needs to draw the stacks, since a driver may not read the estimate.
   */
  async function landingDrawings(order: Pick<OrderRow, 'estimate_id' | 'contractor_organisation_id'>): Promise<{ system: RoofSystem; byFace: Map<string, LandingFaceDrawing> } | null> {
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
        openings: schedule.openings
          .filter((o) => faceKey(o.building, o.face) === key)
          .map(({ building, face, kind, width_mm, height_mm, quantity }) => ({ building, face, kind, width_mm, height_mm, quantity })),
      });
    }
    return { system: e.system_input, byFace };
  }

  async function followUpOf(orderId: number): Promise<{ reference: string; due_date: string | null } | null> {
    const f = await orders.followUpOf(orderId);
    if (!f) return null;
    const booking = await slots.booking(f.id);
    const row = await repo.orderDay(f.id);
    const slot = booking && row ? await slots.find(row.merchant_organisation_id, booking.slot_id) : undefined;
    return { reference: orderReference(f.id), due_date: slot?.date ?? row?.requested_date ?? null };
  }

  async function proofOf(order: OrderRow): Promise<DeliveryProof | null> {
    const p = await repo.proofOf(order.id);
    if (!p) return null;
    const [lines, files, draft, orderLines] = await Promise.all([repo.proofLines(p.id), repo.files(p.id), repo.draftOfProof(p.id), orders.lines(order.id)]);
    const byId = new Map(orderLines.map((l) => [l.id, l]));
    const base = proofBase(order.id);
    const signature = files.find((f) => f.kind === 'signature');
    return {
      order_id: order.id,
      receiver_name: p.receiver_name,
      delivered_at: p.delivered_at,
      recorded_by: { id: p.recorded_by ?? 0, name: p.recorded_by_name },
      position: p.lat !== null && p.lng !== null ? { lat: p.lat, lng: p.lng, ...(p.accuracy_m !== null ? { accuracy_m: p.accuracy_m } : {}) } : null,
      note: p.note,
      signature_url: signature ? `${base}/signature` : null,
      photos: files
        .filter((f) => f.kind === 'photo')
        .map((f) => ({ id: f.id, url: `${base}/photos/${f.id}`, thumbnail_url: `${base}/photos/${f.id}/thumbnail`, content_type: f.content_type })),
      lines: lines.map((l) => {
        const ol = byId.get(l.order_line_id);
        return { line_id: l.order_line_id, sku: ol?.sku ?? '', description: ol?.description ?? '', unit: ol?.unit ?? '', sent: l.sent, handed_over: l.handed_over, short: l.short, damaged: l.damaged };
      }),
      credit_note_id: draft?.id ?? null,
    };
  }

  /** Per line what was sent, handed over, short and damaged; every loaded line is accounted for. */
  function proofLines(record: DeliveryRecord, lines: StoredOrderLine[]): ProofLineRow[] {
    const problems: { path: string; message: string }[] = [];
    const given = new Map<number, { handed_over: number; short: number | null; damaged: number }>();
    (record.lines ?? []).forEach((l, i) => {
      const line = lines.find((x) => x.id === l.line_id);
      if (!line) return problems.push({ path: `lines.${i}.line_id`, message: 'is not a line of this order' });
      if (given.has(l.line_id)) return problems.push({ path: `lines.${i}.line_id`, message: 'is given twice' });
      const sent = line.reserved_quantity;
      if (l.short === null) {
        if (l.handed_over > sent) return problems.push({ path: `lines.${i}.delivered_quantity`, message: `at most the ${sent} packs loaded` });
      } else if (l.handed_over + l.short + l.damaged !== sent) {
        return problems.push({
          path: `lines.${i}`,
          message: `${line.sku}: handed over (${l.handed_over}), short (${l.short}) and damaged (${l.damaged}) must add up to the ${sent} packs loaded`,
        });
      }
      given.set(l.line_id, l);
    });
    if (problems.length > 0) throw invalid(problems, 'Some delivered quantities are not valid');
    return lines
      .filter((l) => l.reserved_quantity > 0 || given.has(l.id))
      .map((l) => {
        const sent = l.reserved_quantity;
        const g = given.get(l.id);
        if (!g) return { order_line_id: l.id, sent, handed_over: sent, short: 0, damaged: 0 };
        return { order_line_id: l.id, sent, handed_over: g.handed_over, short: g.short ?? sent - g.handed_over - g.damaged, damaged: g.damaged };
      });
  }

  /** Shortages and damages at the order's prices, tax per line at the product's rate now (as an invoice would take it). */
  async function draftLines(trx: Db, orgId: number, proof: ProofLineRow[], lines: StoredOrderLine[]): Promise<DraftLine[]> {
    const owed = proof.filter((p) => p.short + p.damaged > 0);
    if (owed.length === 0) return [];
    const byId = new Map(lines.map((l) => [l.id, l]));
    const rates = await repo.taxRates(orgId, owed.map((p) => byId.get(p.order_line_id)!.product_id), trx);
    return owed.map((p) => {
      const l = byId.get(p.order_line_id)!;
      const quantity = p.short + p.damaged;
      const net = quantity * l.unit_price;
      const rate = rates.get(l.product_id) ?? 0;
      const tax = lineTax(net, rate);
      return { order_line_id: l.id, sku: l.sku, description: l.description, short: p.short, damaged: p.damaged, quantity, unit_price: l.unit_price, tax_rate_bp: rate, net, tax, total: net + tax };
    });
  }

  /**
   * Writes the delivery's e-mails to the outbox in the recording transaction: the desk's note, and the
   * contractor's with the signed delivery note attached. The PDF (with its photos) is named by
   * reference and made by the worker when it sends, from the proof this transaction records.
   */
  async function mailDelivered(trx: Db, user: AuthUser, orderId: number, proof: ProofLineRow[], lines: Map<number, StoredOrderLine>, receiver: string, booked: boolean) {
    const party = { kind: 'merchant' as const, organisationId: user.organisation.id };
    const order = (await orders.find(party, orderId, trx))!;
    const contractor = await orders.contractorEmails(order, trx);
    const desk = await orders.deskEmails(order.merchant_organisation_id, trx);
    await sendOrderMail(trx, deps, 'delivered', order, { contractor: [], desk });
    // The delivery note prints once the order is on a run; without one there is nothing to send.
    if (contractor.length === 0 || !booked) return;
    const ref = orderReference(orderId);
    const short = proof.filter((l) => l.short + l.damaged > 0);
    for (const to of contractor) {
      await enqueueMail(
        trx,
        {
          ...renderEmail({
            to,
            subject: `Order ${ref} delivered: delivery note attached`,
            heading: `Order ${ref} delivered`,
            paragraphs: [
              `The driver handed the delivery over at ${order.site_name} to ${receiver}. The signed delivery note is attached.`,
              ...(short.length > 0 ? [`Short or damaged: ${short.map((l) => `${lines.get(l.order_line_id)?.description ?? ''} ${l.short + l.damaged} of ${l.sent}`).join('; ')}. ${order.merchant_name} will credit them.`] : []),
            ],
            action: { label: 'Open the order', url: `${config.appUrl}/orders/${orderId}` },
          }),
          attachments: [{ filename: `delivery-note-${ref}.pdf`, contentType: 'application/pdf', render: { kind: DELIVERY_NOTE_ATTACHMENT, organisation_id: user.organisation.id, order_id: orderId } }],
        },
        config.mailDomain,
      );
    }
  }

  async function notePdf(order: OrderRow): Promise<Buffer> {
    const booking = await slots.booking(order.id);
    if (!booking) throw AppError.conflict('not_booked', `${orderReference(order.id)} is not booked onto a run yet: its delivery note prints once it is`);
    const [slot, lines, proof, faces, followUp] = await Promise.all([
      slots.find(order.merchant_organisation_id, booking.slot_id),
      orders.lines(order.id),
      proofOf(order),
      estimateFaces(order),
      followUpOf(order.id),
    ]);
    const p = proof ? await repo.proofOf(order.id) : undefined;
    const files = p ? await repo.files(p.id) : [];
    const signature = p && files.some((f) => f.kind === 'signature') ? await repo.fileData(p.id, null, 'signature', false) : undefined;
    const photos: { content_type: string; data: Buffer }[] = [];
    for (const f of files.filter((x) => x.kind === 'photo')) {
      const data = await repo.fileData(p!.id, f.id, 'photo', false);
      if (data) photos.push(data);
    }
    const branch = await repo.branch(order.branch_id);
    return deliveryNotePdf({
      order,
      branch: { name: branch?.name ?? order.branch_name, address: [branch?.address, branch?.town].filter(Boolean).join(', '), phone: branch?.phone ?? '' },
      slot: slot ? { date: slot.date, time_window: slot.time_window, registration: slot.registration, driver: slot.driver_name } : null,
      lines,
      short_faces: shortFaces(faces, booking.plan.pallets, lines, followUp),
      proof,
      signature: signature?.data ?? null,
      photos,
    });
  }

  async function dayRuns(orgId: number, runs: SlotRow[], readerId: number): Promise<DriverDay['runs']> {
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
        const faces = await estimateFaces(order);
        const short = shortFaces(faces, pallets, lines, lines.some((l) => l.back_order_quantity > 0) ? await followUpOf(b.order_id) : null);
        cautions.push(orderCautions(b.delivery_method, site));
        const drawings = b.delivery_method === 'roof' ? await landingDrawings(order) : null;
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
        lorry: await lorryOf(run),
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

  async function lorryOf(run: SlotRow) {
    const l = await repo.deck(run.lorry_id);
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

  return {
    /** The runs of one driver on one day (the signed-in driver's own; the owner or dispatcher names one). */
    async driverDay(user: AuthUser, q: { date?: string; driver_id?: number }): Promise<DriverDay> {
      const date = q.date ?? config.calendar.today();
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
      return { date, driver: { id: driver.id, name: driver.name }, runs: await dayRuns(user.organisation.id, runs, driverId) };
    },

    /** The run's driver records having read its cautions; the first reading's time stands. */
    async readCautions(user: AuthUser, runId: number) {
      const run = await slots.find(user.organisation.id, runId);
      if (!run) throw AppError.notFound('Run');
      if (user.role !== 'driver' || run.driver_user_id !== user.id) {
        if (user.role === 'driver') throw AppError.notFound('Run');
        throw AppError.forbidden("Only the run's driver acknowledges its cautions");
      }
      const at = await repo.readCautions(run.id, { id: user.id, name: user.name });
      return { run_id: run.id, read_at: at, read_by: { id: user.id, name: user.name } };
    },

    /**
     * Records the hand-over: who took it, when and where, the signature and photos, and per line the
     * packs handed over, short and damaged. The order's hold on stock ends; what left the lorry
     * (handed over or damaged) leaves the branch's on-hand count, short packs stay in it. Shortages
     * and damages raise a draft credit note for the desk. One transaction: nothing is half-written.
     */
    async record(user: AuthUser, orderId: number, record: DeliveryRecord, files: ProofFile[]) {
      if (user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const t = ORDER_TRANSITIONS.deliver;
      await db.transaction(async (trx) => {
        const order = await orders.find(partyOf(user), orderId, trx);
        if (!order) throw AppError.notFound('Order');
        const booking = await slots.booking(orderId, trx);
        const slot = booking ? await slots.find(user.organisation.id, booking.slot_id, trx) : undefined;
        if (user.role === 'driver' && slot?.driver_user_id !== user.id) throw AppError.forbidden('Only the driver of this run records its delivery');
        if (!(t.from as readonly string[]).includes(order.status)) {
          throw AppError.conflict('order_not_on_the_road', `${orderReference(orderId)} is ${ORDER_STATUS_LABELS[order.status].toLowerCase()}: a delivery is recorded once it is on the road`);
        }
        const lines = await orders.lines(orderId, trx);
        const proof = proofLines(record, lines);
        const byId = new Map(lines.map((l) => [l.id, l]));
        for (const p of proof) {
          const line = byId.get(p.order_line_id)!;
          const left = p.handed_over + p.damaged;
          if (!(await stock.consume(trx, order.branch_id, line.product_id, line.reserved_quantity, left))) {
            throw AppError.conflict('stock_changed', `The stock of ${line.sku} at ${order.branch_name} no longer covers this delivery; count it and try again`);
          }
          await orders.setDelivered(trx, line.id, left);
        }
        const at = record.delivered_at ?? nowIso();
        if (booking) await slots.recordDelivery(trx, orderId, { delivered_at: at, received_by: record.receiver_name, delivery_notes: record.note, recorded_by: user.id });
        if (!(await orders.updateIf(trx, orderId, { statuses: t.from }, { status: t.to }, false))) throw AppError.conflict('order_changed', 'The order changed at the same moment; reload it and try again');
        const proofId = await repo.insertProof(
          trx,
          {
            order_id: orderId,
            merchant_organisation_id: user.organisation.id,
            receiver_name: record.receiver_name,
            delivered_at: at,
            recorded_by: user.id,
            recorded_by_name: user.name,
            lat: record.position?.lat ?? null,
            lng: record.position?.lng ?? null,
            accuracy_m: record.position?.accuracy_m ?? null,
            note: record.note,
          },
          proof,
          files,
        );
        const owed = await draftLines(trx, user.organisation.id, proof, lines);
        let draftId: number | null = null;
        if (owed.length > 0) {
          const subtotal = owed.reduce((s, l) => s + l.net, 0);
          const taxTotal = owed.reduce((s, l) => s + l.tax, 0);
          draftId = await repo.insertDraft(trx, {
            merchant_organisation_id: order.merchant_organisation_id,
            contractor_organisation_id: order.contractor_organisation_id,
            order_id: orderId,
            proof_id: proofId,
            currency: config.currency,
            subtotal,
            tax_total: taxTotal,
            total: subtotal + taxTotal,
            lines: owed,
            notes: `Delivery of ${orderReference(orderId)} received by ${record.receiver_name}${record.note ? `: ${record.note}` : ''}`,
          });
        }
        const short = proof.filter((p) => p.short > 0).map((p) => `${byId.get(p.order_line_id)!.sku} ${p.short} of ${p.sent}`);
        const damaged = proof.filter((p) => p.damaged > 0).map((p) => `${byId.get(p.order_line_id)!.sku} ${p.damaged}`);
        await orders.insertEvent(trx, orderId, {
          kind: 'delivered',
          actor: { userId: user.id, name: user.name, organisationId: user.organisation.id },
          summary: `Delivered, received by ${record.receiver_name}${short.length > 0 ? `; short: ${short.join(', ')}` : ''}${damaged.length > 0 ? `; damaged: ${damaged.join(', ')}` : ''}${files.length > 0 ? `; ${files.filter((f) => f.kind === 'photo').length} photos` : ''}`,
          data: { received_by: record.receiver_name, delivered_at: at, short, damaged, proof_id: proofId, credit_note_draft_id: draftId, ...(record.note ? { notes: record.note } : {}) },
        });
        await mailDelivered(trx, user, orderId, proof, byId, record.receiver_name, !!booking);
      });
      // The order as the desk sees it (as this route always answered), with the proof beside it.
      const detail = await orderDetails.get(user, orderId);
      return { ...detail, proof: (await proofOf((await orders.find(partyOf(user), orderId))!))! };
    },

    async proof(user: AuthUser, orderId: number): Promise<DeliveryProof> {
      const proof = await proofOf(await orderFor(user, orderId));
      if (!proof) throw AppError.notFound('Proof of delivery');
      return proof;
    },

    async file(user: AuthUser, orderId: number, kind: 'signature' | 'photo', fileId: number | null, thumbnail: boolean) {
      await orderFor(user, orderId);
      const p = await repo.proofOf(orderId);
      const f = p ? await repo.fileData(p.id, fileId, kind, thumbnail) : undefined;
      if (!f) throw AppError.notFound(kind === 'signature' ? 'Signature' : 'Photo');
      return f;
    },

    /** The delivery note sent with the contractor's e-mail, made when the outbox sends it. */
    async deliveryNoteForMail(ref: AttachmentRef): Promise<Buffer> {
      const order = await orders.find({ kind: 'merchant', organisationId: Number(ref.organisation_id) }, Number(ref.order_id));
      if (!order) throw new Error(`the delivery note of order ${String(ref.order_id)} cannot be made: the order is gone`);
      return notePdf(order);
    },

    async deliveryNote(user: AuthUser, orderId: number) {
      const order = await orderFor(user, orderId);
      return { reference: orderReference(order.id), pdf: await notePdf(order) };
    },

    /** A draft credit note of the caller's firm (the desk's). */
    async draft(user: AuthUser, id: number): Promise<CreditNoteDraft> {
      if (user.organisation.kind !== 'merchant') throw AppError.notFound('Credit note draft');
      const d = await repo.draft(user.organisation.id, id);
      if (!d) throw AppError.notFound('Credit note draft');
      const { merchant_organisation_id: _m, contractor_organisation_id: _c, proof_id: _p, ...rest } = d;
      return rest;
    },

    /**
     * The desk issues a draft as a credit note against the order's invoice. It credits what the invoice
     * charged beyond the packs handed over in good order: all of the short and damaged packs on an
     * invoice made from the confirmation, only the damaged ones on an invoice made from the delivery
     * (which already left the short packs out). One note, reason "shortage" when any pack was short.
     */
    async issueDraft(user: AuthUser, id: number) {
      if (!issueCredit || user.organisation.kind !== 'merchant') throw AppError.forbidden();
      const d = await repo.draft(user.organisation.id, id);
      if (!d) throw AppError.notFound('Credit note draft');
      if (d.status !== 'draft') throw AppError.conflict('draft_closed', `This draft was already ${d.status}`);
      const invoice = await repo.invoiceOfOrder(user.organisation.id, d.order_id);
      if (!invoice) throw AppError.conflict('not_invoiced', `Issue the invoice of ${orderReference(d.order_id)} first: the credit note credits what it charges`);
      const proof = new Map((await repo.proofLines(d.proof_id)).map((p) => [p.order_line_id, p]));
      const lines = d.lines.flatMap((l) => {
        const il = invoice.lines.find((x) => x.order_line_id === l.order_line_id);
        if (!il) return [];
        const charged = il.quantity - il.credited - (proof.get(l.order_line_id)?.handed_over ?? 0);
        const quantity = Math.min(l.quantity, Math.max(0, charged));
        return quantity > 0 ? [{ invoice_line_id: il.id, quantity }] : [];
      });
      if (lines.length === 0) throw AppError.conflict('nothing_to_credit', `The invoice of ${orderReference(d.order_id)} does not charge the short or damaged packs: there is nothing to credit`);
      if (!(await repo.moveDraft(d.id, 'draft', 'issued'))) throw AppError.conflict('draft_closed', 'This draft was issued at the same moment');
      try {
        await issueCredit(user, invoice.id, { reason: d.lines.some((l) => l.short > 0) ? 'shortage' : 'damage', notes: d.notes.slice(0, 2000), lines });
      } catch (err) {
        await repo.moveDraft(d.id, 'issued', 'draft');
        throw err;
      }
      await repo.setDraftCreditNote(d.id, await repo.latestCreditNote(invoice.id));
      return this.draft(user, d.id);
    },

    async drafts(user: AuthUser): Promise<{ drafts: CreditNoteDraft[] }> {
      if (user.organisation.kind !== 'merchant') return { drafts: [] };
      return { drafts: (await repo.drafts(user.organisation.id, 'draft')).map(({ merchant_organisation_id: _m, contractor_organisation_id: _c, proof_id: _p, ...rest }) => rest) };
    },
  };
}

export type DeliveriesService = ReturnType<typeof deliveriesService>;
