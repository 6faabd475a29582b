import { orderReference } from '../../../../shared/schemas/order.schema';
import type { CreditNoteDraft } from '../../../../shared/schemas/run.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { AppError } from '../../../http/app-error';
import type { DeliveryContext } from './delivery-context';

/** A draft credit note of the caller's firm (the desk's). */
export async function creditDraft(ctx: DeliveryContext, user: AuthUser, id: number): Promise<CreditNoteDraft> {
  const { repo } = ctx;
  if (user.organisation.kind !== 'merchant') throw AppError.notFound('Credit note draft');
  const d = await repo.draft(user.organisation.id, id);
  if (!d) throw AppError.notFound('Credit note draft');
  const { merchant_organisation_id: _m, contractor_organisation_id: _c, proof_id: _p, ...rest } = d;
  return rest;
}

/**
 * The desk issues a draft as a credit note against the order's invoice. It credits what the invoice
 * charged beyond the packs handed over in good order: all of the short and damaged packs on an
 * invoice made from the confirmation, only the damaged ones on an invoice made from the delivery
 * (which already left the short packs out). One note, reason "shortage" when any pack was short.
 */
export async function issueCreditDraft(ctx: DeliveryContext, user: AuthUser, id: number) {
  const { repo, issueCredit } = ctx;
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
  return creditDraft(ctx, user, d.id);
}

/** The drafts waiting for the desk. */
export async function openCreditDrafts(ctx: DeliveryContext, user: AuthUser): Promise<{ drafts: CreditNoteDraft[] }> {
  if (user.organisation.kind !== 'merchant') return { drafts: [] };
  return { drafts: (await ctx.repo.drafts(user.organisation.id, 'draft')).map(({ merchant_organisation_id: _m, contractor_organisation_id: _c, proof_id: _p, ...rest }) => rest) };
}
