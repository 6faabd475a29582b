import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';

/** Whose view: the merchant that issued the invoice, or the contractor it is addressed to. */
export interface InvoiceParty {
  kind: 'contractor' | 'merchant';
  organisationId: number;
}

export interface InvoiceRow {
  id: number;
  merchant_organisation_id: number;
  merchant_name: string;
  contractor_organisation_id: number;
  contractor_name: string;
  branch_id: number;
  branch_name: string;
  branch_town: string;
  branch_address: string;
  order_id: number;
  site_name: string;
  po_reference: string;
  number: number;
  currency: string;
  basis: 'delivered' | 'confirmed';
  pay_by: 'account' | 'card';
  issue_date: string;
  due_date: string | null;
  subtotal: number;
  tax_total: number;
  total: number;
  credited: number;
  paid: number;
  created_at: string;
}

/** The money of a line charged or credited: packs at the pack price, and the tax on them (minor units). */
export interface TaxedLineFigures {
  quantity: number;
  unit_price: number;
  tax_rate_bp: number;
  net: number;
  tax: number;
  total: number;
}

export interface InvoiceLineRow extends TaxedLineFigures {
  id: number;
  invoice_id: number;
  position: number;
  order_line_id: number | null;
  sku: string;
  description: string;
  unit: string;
  pack_size: number;
}

export type NewInvoiceLine = Omit<InvoiceLineRow, 'id' | 'invoice_id'>;

export interface PaymentRow {
  id: number;
  invoice_id: number;
  method: 'card';
  status: 'open' | 'succeeded' | 'failed';
  amount: number;
  currency: string;
  provider_session_id: string | null;
  provider_payment_id: string | null;
  checkout_url: string | null;
  last_error: string | null;
  paid_at: string | null;
  created_at: string;
}

const INVOICE_COLUMNS = ['i.*', 'mo.name as merchant_name', 'co.name as contractor_name', 'b.name as branch_name', 'b.town as branch_town', 'b.address as branch_address', 'o.site_name', 'o.po_reference'];

/**
 * Invoices, credit notes, card payments and refunds. Every read is scoped to the merchant that
 * issued the invoice or the contractor it is addressed to.
 */
export function invoicesRepository(db: Db) {
  const scoped = (trx: Db, party: InvoiceParty) => {
    const q = trx('invoices as i')
      .join('organisations as mo', 'mo.id', 'i.merchant_organisation_id')
      .join('organisations as co', 'co.id', 'i.contractor_organisation_id')
      .join('branches as b', 'b.id', 'i.branch_id')
      .join('orders as o', 'o.id', 'i.order_id');
    if (party.kind === 'merchant') q.where('i.merchant_organisation_id', party.organisationId);
    else q.where('i.contractor_organisation_id', party.organisationId);
    return q;
  };

  return {
    /** The next number of a merchant's series, taken inside the caller's transaction: a rolled-back issue leaves no gap. */
    async nextNumber(trx: Db, orgId: number, series: 'invoice' | 'credit_note'): Promise<number> {
      const bumped = await trx('document_sequences').where({ organisation_id: orgId, series }).increment('last_number', 1);
      if (bumped === 0) {
        await trx('document_sequences').insert({ organisation_id: orgId, series, last_number: 1 });
        return 1;
      }
      const row = await trx('document_sequences').where({ organisation_id: orgId, series }).first('last_number');
      return row.last_number as number;
    },

    async insert(
      trx: Db,
      inv: Omit<InvoiceRow, 'id' | 'merchant_name' | 'contractor_name' | 'branch_name' | 'branch_town' | 'branch_address' | 'site_name' | 'po_reference' | 'credited' | 'paid' | 'created_at'> & { issued_by: number },
      lines: NewInvoiceLine[],
    ): Promise<number> {
      const now = nowIso();
      const [row] = await trx('invoices')
        .insert({ ...inv, credited: 0, paid: 0, created_at: now, updated_at: now })
        .returning('id');
      const id = (row as { id: number }).id;
      if (lines.length > 0) await trx('invoice_lines').insert(lines.map((l) => ({ ...l, invoice_id: id })));
      return id;
    },

    async find(party: InvoiceParty, id: number, trx: Db = db): Promise<InvoiceRow | undefined> {
      return scoped(trx, party).where('i.id', id).select(INVOICE_COLUMNS).first();
    },

    async byOrder(orderId: number, trx: Db = db): Promise<{ id: number } | undefined> {
      return trx('invoices').where({ order_id: orderId }).first('id');
    },

    async list(party: InvoiceParty, f: { contractor_id?: number; page: number; page_size: number; status?: string }): Promise<{ rows: InvoiceRow[]; total: number }> {
      const base = () => {
        const q = scoped(db, party);
        if (f.contractor_id) q.where('i.contractor_organisation_id', f.contractor_id);
        if (f.status === 'paid') q.whereRaw('?? + ?? >= ?? and ?? > ??', ['i.paid', 'i.credited', 'i.total', 'i.total', 'i.credited']);
        if (f.status === 'credited') q.whereRaw('?? >= ??', ['i.credited', 'i.total']);
        if (f.status === 'unpaid') q.where('i.paid', 0).whereRaw('?? < ??', ['i.credited', 'i.total']);
        if (f.status === 'part_paid') q.where('i.paid', '>', 0).whereRaw('?? + ?? < ??', ['i.paid', 'i.credited', 'i.total']);
        return q;
      };
      const totalRow = await base().count({ n: '*' }).first();
      const rows = await base()
        .select(INVOICE_COLUMNS)
        .orderBy([
          { column: 'i.created_at', order: 'desc' },
          { column: 'i.id', order: 'desc' },
        ])
        .limit(f.page_size)
        .offset((f.page - 1) * f.page_size);
      return { rows, total: Number(totalRow?.n ?? 0) };
    },

    async lines(invoiceId: number, trx: Db = db): Promise<(InvoiceLineRow & { credited_quantity: number; credited_net: number; credited_tax: number })[]> {
      const rows = await trx('invoice_lines').where({ invoice_id: invoiceId }).orderBy('position');
      const credited = await trx('credit_note_lines as cl')
        .join('invoice_lines as il', 'il.id', 'cl.invoice_line_id')
        .where('il.invoice_id', invoiceId)
        .groupBy('cl.invoice_line_id')
        .select('cl.invoice_line_id')
        .sum({ quantity: 'cl.quantity', net: 'cl.net', tax: 'cl.tax' });
      const by = new Map((credited as Record<string, unknown>[]).map((c) => [c.invoice_line_id as number, c]));
      return rows.map((r) => ({
        ...r,
        credited_quantity: Number(by.get(r.id)?.quantity ?? 0),
        credited_net: Number(by.get(r.id)?.net ?? 0),
        credited_tax: Number(by.get(r.id)?.tax ?? 0),
      }));
    },

    async addCredited(trx: Db, invoiceId: number, amount: number): Promise<boolean> {
      const n = await trx('invoices')
        .where('id', invoiceId)
        .whereRaw('?? + ? <= ??', ['credited', amount, 'total'])
        .update({ credited: trx.raw('?? + ?', ['credited', amount]), updated_at: nowIso() });
      return n > 0;
    },

    async addPaid(trx: Db, invoiceId: number, amount: number): Promise<void> {
      await trx('invoices')
        .where('id', invoiceId)
        .update({ paid: trx.raw('?? + ?', ['paid', amount]), updated_at: nowIso() });
    },

    async insertCreditNote(
      trx: Db,
      cn: {
        merchant_organisation_id: number;
        contractor_organisation_id: number;
        invoice_id: number;
        number: number;
        reason: string;
        notes: string;
        subtotal: number;
        tax_total: number;
        total: number;
        issued_by: number;
      },
      lines: { invoice_line_id: number; quantity: number; unit_price: number; tax_rate_bp: number; net: number; tax: number; total: number }[],
    ): Promise<number> {
      const [row] = await trx('credit_notes')
        .insert({ ...cn, created_at: nowIso() })
        .returning('id');
      const id = (row as { id: number }).id;
      await trx('credit_note_lines').insert(lines.map((l) => ({ ...l, credit_note_id: id })));
      return id;
    },

    async creditNotes(invoiceId: number, trx: Db = db) {
      const notes = await trx('credit_notes as c')
        .leftJoin('refunds as r', 'r.credit_note_id', 'c.id')
        .where('c.invoice_id', invoiceId)
        .select('c.*', 'r.status as refund_status', 'r.amount as refund_amount', 'r.last_error as refund_error')
        .orderBy('c.id');
      if (notes.length === 0) return [];
      const lines = await trx('credit_note_lines as cl')
        .join('invoice_lines as il', 'il.id', 'cl.invoice_line_id')
        .whereIn(
          'cl.credit_note_id',
          notes.map((n) => n.id),
        )
        .select('cl.*', 'il.sku', 'il.description')
        .orderBy('cl.id');
      return notes.map((n) => ({ ...n, lines: lines.filter((l) => l.credit_note_id === n.id) }));
    },

    async creditNote(party: InvoiceParty, id: number, trx: Db = db) {
      const q = trx('credit_notes').where('id', id);
      if (party.kind === 'merchant') q.where('merchant_organisation_id', party.organisationId);
      else q.where('contractor_organisation_id', party.organisationId);
      return q.first();
    },

    // Card payments.

    async payments(invoiceId: number, trx: Db = db): Promise<PaymentRow[]> {
      return trx('payments').where({ invoice_id: invoiceId }).orderBy('id');
    },

    async payment(id: number, trx: Db = db): Promise<PaymentRow | undefined> {
      return trx('payments').where({ id }).first();
    },

    async paymentBySession(sessionId: string, trx: Db = db): Promise<PaymentRow | undefined> {
      return trx('payments').where({ provider_session_id: sessionId }).first();
    },

    async openPayment(invoiceId: number, trx: Db = db): Promise<PaymentRow | undefined> {
      return trx('payments').where({ open_for_invoice: invoiceId }).first();
    },

    async insertPayment(trx: Db, p: { invoice_id: number; amount: number; currency: string; created_by: number }): Promise<number> {
      const now = nowIso();
      const [row] = await trx('payments')
        .insert({ ...p, method: 'card', status: 'open', open_for_invoice: p.invoice_id, created_at: now, updated_at: now })
        .returning('id');
      return (row as { id: number }).id;
    },

    async updatePayment(trx: Db, id: number, v: Partial<Omit<PaymentRow, 'id'>> & { open_for_invoice?: number | null }, onlyIfOpen = false): Promise<boolean> {
      const q = trx('payments').where({ id });
      if (onlyIfOpen) q.where('status', 'open');
      return (await q.update({ ...v, updated_at: nowIso() })) > 0;
    },

    /** Records a provider event once; false when it was seen before (a replay). */
    async firstSight(trx: Db, eventId: string, type: string, paymentId: number | null): Promise<boolean> {
      if (await trx('payment_events').where({ event_id: eventId }).first()) return false;
      await trx('payment_events').insert({ event_id: eventId, type, payment_id: paymentId, received_at: nowIso() });
      return true;
    },

    async insertRefund(trx: Db, r: { credit_note_id: number; payment_id: number; amount: number }): Promise<number> {
      const now = nowIso();
      const [row] = await trx('refunds')
        .insert({ ...r, status: 'pending', created_at: now, updated_at: now })
        .returning('id');
      return (row as { id: number }).id;
    },

    async refundOf(creditNoteId: number, trx: Db = db) {
      return trx('refunds as r').join('payments as p', 'p.id', 'r.payment_id').where('r.credit_note_id', creditNoteId).select('r.*', 'p.provider_payment_id', 'p.invoice_id').first();
    },

    async updateRefund(trx: Db, id: number, v: { status: string; provider_refund_id?: string | null; last_error?: string | null }, onlyIfNotDone = true): Promise<boolean> {
      const q = trx('refunds').where({ id });
      if (onlyIfNotDone) q.whereNot('status', 'succeeded');
      return (await q.update({ ...v, updated_at: nowIso() })) > 0;
    },

    // Account customers.

    async terms(merchantId: number, contractorId: number, trx: Db = db): Promise<number | null> {
      const row = await trx('contractor_accounts').where({ merchant_organisation_id: merchantId, contractor_organisation_id: contractorId }).first('terms_days');
      return row ? (row.terms_days as number) : null;
    },

    /** Card payment is open to a contractor without an account, and to one with an account unless the merchant turned it off. */
    async cardAllowed(merchantId: number, contractorId: number, trx: Db = db): Promise<boolean> {
      const row = await trx('contractor_accounts').where({ merchant_organisation_id: merchantId, contractor_organisation_id: contractorId }).first('card_payments');
      return row ? Boolean(row.card_payments) : true;
    },

    /** Every contractor that has ordered from the merchant or has an account with it. */
    async accounts(merchantId: number) {
      return db('organisations as co')
        .leftJoin('contractor_accounts as a', function () {
          this.on('a.contractor_organisation_id', '=', 'co.id').andOn('a.merchant_organisation_id', '=', db.raw('?', [merchantId]));
        })
        .where('co.kind', 'contractor')
        .where((w) => w.whereNotNull('a.id').orWhereExists(db('orders as o').whereRaw('?? = ??', ['o.contractor_organisation_id', 'co.id']).where('o.merchant_organisation_id', merchantId)))
        .select('co.id', 'co.name', 'a.terms_days', 'a.card_payments')
        .select(db('orders as o2').count('*').whereRaw('?? = ??', ['o2.contractor_organisation_id', 'co.id']).where('o2.merchant_organisation_id', merchantId).as('orders'))
        .orderBy('co.name');
    },

    async knowsContractor(merchantId: number, contractorId: number): Promise<boolean> {
      const row = await db('orders').where({ merchant_organisation_id: merchantId, contractor_organisation_id: contractorId }).first('id');
      return Boolean(row);
    },

    async putTerms(merchantId: number, contractorId: number, termsDays: number, cardPayments?: boolean): Promise<void> {
      const now = nowIso();
      const card = cardPayments === undefined ? {} : { card_payments: cardPayments ? 1 : 0 };
      await db('contractor_accounts')
        .insert({ merchant_organisation_id: merchantId, contractor_organisation_id: contractorId, terms_days: termsDays, ...card, created_at: now, updated_at: now })
        .onConflict(['merchant_organisation_id', 'contractor_organisation_id'])
        .merge({ terms_days: termsDays, ...card, updated_at: now });
    },

    async deleteTerms(merchantId: number, contractorId: number): Promise<void> {
      await db('contractor_accounts').where({ merchant_organisation_id: merchantId, contractor_organisation_id: contractorId }).delete();
    },
  };
}

export type InvoicesRepository = ReturnType<typeof invoicesRepository>;
