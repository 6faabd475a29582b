import { orderReference } from '../../../../shared/schemas/order.schema';
import type { DeliveryProof } from '../../../../shared/schemas/run.schema';
import type { AuthUser } from '../../../auth/auth-user';
import type { Db } from '../../../db/knex';
import { AppError } from '../../../http/app-error';
import { estimatesRepository } from '../../estimates/estimates.repository';
import { fleetRepository } from '../../fleet/fleet.repository';
import { ordersService } from '../../orders/orders.service';
import { ordersRepository, type OrderParty, type OrderRow } from '../../orders/orders.repository';
import { schedulesRepository } from '../../schedules/schedules.repository';
import { slotsRepository } from '../../slots/slots.repository';
import { stockRepository } from '../../stock/stock.repository';
import { deliveriesRepository } from '../deliveries.repository';
import { deliveryNotePdf } from '../delivery-note';
import { shortFaces, type EstimateFace } from '../drop-sheet';
import type { DeliveriesDeps, IssueCredit } from '../deliveries.service';

export const partyOf = (user: AuthUser): OrderParty => ({ kind: user.organisation.kind, organisationId: user.organisation.id });
export const invalid = (problems: { path: string; message: string }[], message = 'Some fields are not valid') => AppError.unprocessable('validation_failed', message, problems);
const proofBase = (orderId: number) => `/api/orders/${orderId}/delivery`;

/**
 * What the delivery use cases share: the app's deps, the repositories they read and write, the order
 * as the caller may see its delivery, its proof, and its delivery note.
 */
export function deliveryContext(deps: DeliveriesDeps, issueCredit?: IssueCredit) {
  const { db } = deps;
  const repo = deliveriesRepository(db);
  const orders = ordersRepository(db);
  const slots = slotsRepository(db);
  const estimates = estimatesRepository(db);

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
      photos: files.filter((f) => f.kind === 'photo').map((f) => ({ id: f.id, url: `${base}/photos/${f.id}`, thumbnail_url: `${base}/photos/${f.id}/thumbnail`, content_type: f.content_type })),
      lines: lines.map((l) => {
        const ol = byId.get(l.order_line_id);
        return { line_id: l.order_line_id, sku: ol?.sku ?? '', description: ol?.description ?? '', unit: ol?.unit ?? '', sent: l.sent, handed_over: l.handed_over, short: l.short, damaged: l.damaged };
      }),
      credit_note_id: draft?.id ?? null,
    };
  }

  async function notePdf(order: OrderRow): Promise<Buffer> {
    const booking = await slots.booking(order.id);
    if (!booking) throw AppError.conflict('not_booked', `${orderReference(order.id)} is not booked onto a run yet: its delivery note prints once it is`);
    const [slot, lines, proof, faces, followUp] = await Promise.all([slots.find(order.merchant_organisation_id, booking.slot_id), orders.lines(order.id), proofOf(order), estimateFaces(order), followUpOf(order.id)]);
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

  return {
    deps,
    db,
    issueCredit,
    repo,
    orders,
    slots,
    fleet: fleetRepository(db),
    estimates,
    schedules: schedulesRepository(db),
    stock: stockRepository(db),
    orderDetails: ordersService(deps),
    orderFor,
    estimateFaces,
    followUpOf,
    proofOf,
    notePdf,
  };
}

export type DeliveryContext = ReturnType<typeof deliveryContext>;
