import type { AppDeps } from '../../app-deps';
import type { AuthUser } from '../../auth/auth-user';
import { orderReference } from '../../../shared/schemas/order.schema';
import type { DeliveryProof } from '../../../shared/schemas/run.schema';
import { AppError } from '../../http/app-error';
import type { AttachmentRef } from '../../mail/outbox';
import type { ProofFile } from './proof-files';
import { creditDraft, issueCreditDraft, openCreditDrafts } from './use-cases/credit-drafts';
import { deliveryContext } from './use-cases/delivery-context';
import { driverDay, readCautions } from './use-cases/driver-day';
import { recordDelivery } from './use-cases/record-delivery';

export { DELIVERY_NOTE_ATTACHMENT } from './use-cases/record-delivery';

/** A delivery record after the JSON or multipart body is read (and an older body with delivered_quantity turned into this). */
export interface DeliveryRecord {
  receiver_name: string;
  note: string;
  delivered_at?: string;
  /** short null: the packs not handed over or damaged are short (the older body's meaning). */
  lines?: { line_id: number; handed_over: number; short: number | null; damaged: number }[];
  position?: { lat: number; lng: number; accuracy_m?: number };
}

export type DeliveriesDeps = Pick<AppDeps, 'db' | 'mailer' | 'logger' | 'config'>;

/** How a draft becomes a credit note: the invoices module's own credit step (numbering, refunds). */
export type IssueCredit = (user: AuthUser, invoiceId: number, body: { reason: 'shortage' | 'damage'; notes?: string; lines: { invoice_line_id: number; quantity: number }[] }) => Promise<unknown>;

/**
 * The driver's side of a delivery: the day's runs with their drops in order, the cautions once per
 * run and their acknowledgement, the proof of delivery (receiver, signature, photos, per line what was
 * handed over, short or damaged), the draft credit note it raises, and the delivery note. Each use case
 * lives in its own file under use-cases/, over one shared context.
 */
export function deliveriesService(deps: DeliveriesDeps, issueCredit?: IssueCredit) {
  const ctx = deliveryContext(deps, issueCredit);
  const { repo } = ctx;
  return {
    driverDay: (user: AuthUser, q: { date?: string; driver_id?: number }) => driverDay(ctx, user, q),
    readCautions: (user: AuthUser, runId: number) => readCautions(ctx, user, runId),
    record: (user: AuthUser, orderId: number, record: DeliveryRecord, files: ProofFile[]) => recordDelivery(ctx, user, orderId, record, files),

    async proof(user: AuthUser, orderId: number): Promise<DeliveryProof> {
      const proof = await ctx.proofOf(await ctx.orderFor(user, orderId));
      if (!proof) throw AppError.notFound('Proof of delivery');
      return proof;
    },

    async file(user: AuthUser, orderId: number, kind: 'signature' | 'photo', fileId: number | null, thumbnail: boolean) {
      await ctx.orderFor(user, orderId);
      const p = await repo.proofOf(orderId);
      const f = p ? await repo.fileData(p.id, fileId, kind, thumbnail) : undefined;
      if (!f) throw AppError.notFound(kind === 'signature' ? 'Signature' : 'Photo');
      return f;
    },

    /** The delivery note sent with the contractor's e-mail, made when the outbox sends it. */
    async deliveryNoteForMail(ref: AttachmentRef): Promise<Buffer> {
      const order = await ctx.orders.find({ kind: 'merchant', organisationId: Number(ref.organisation_id) }, Number(ref.order_id));
      if (!order) throw new Error(`the delivery note of order ${String(ref.order_id)} cannot be made: the order is gone`);
      return ctx.notePdf(order);
    },

    async deliveryNote(user: AuthUser, orderId: number) {
      const order = await ctx.orderFor(user, orderId);
      return { reference: orderReference(order.id), pdf: await ctx.notePdf(order) };
    },

    draft: (user: AuthUser, id: number) => creditDraft(ctx, user, id),
    issueDraft: (user: AuthUser, id: number) => issueCreditDraft(ctx, user, id),
    drafts: (user: AuthUser) => openCreditDrafts(ctx, user),
  };
}

export type DeliveriesService = ReturnType<typeof deliveriesService>;
