import type { Db } from '../../db/knex';
import { nowIso } from '../../db/time';
import type { ProofFile } from './proof-files';
import type { TaxedLineFigures } from '../invoices/invoices.repository';

export interface ProofRow {
  id: number;
  order_id: number;
  merchant_organisation_id: number;
  receiver_name: string;
  delivered_at: string;
  recorded_by: number | null;
  recorded_by_name: string;
  lat: number | null;
  lng: number | null;
  accuracy_m: number | null;
  note: string;
  created_at: string;
}

export interface ProofLineRow {
  order_line_id: number;
  sent: number;
  handed_over: number;
  short: number;
  damaged: number;
}

export interface DraftLine extends TaxedLineFigures {
  order_line_id: number;
  sku: string;
  description: string;
  short: number;
  damaged: number;
}

export interface DraftRow {
  id: number;
  merchant_organisation_id: number;
  contractor_organisation_id: number;
  order_id: number;
  proof_id: number;
  status: 'draft' | 'issued' | 'dismissed';
  currency: string;
  subtotal: number;
  tax_total: number;
  total: number;
  lines: DraftLine[];
  notes: string;
  credit_note_id: number | null;
  created_at: string;
}

export interface FileMeta {
  id: number;
  kind: 'signature' | 'photo';
  position: number;
  content_type: string;
  size: number;
}

/** Proofs of delivery, their files, the credit-note drafts they raise, and drivers' caution reads. Callers check who may see which order first. */
export function deliveriesRepository(db: Db) {
  return {
    async insertProof(trx: Db, p: Omit<ProofRow, 'id' | 'created_at'>, lines: ProofLineRow[], files: ProofFile[]): Promise<number> {
      const [row] = await trx('delivery_proofs')
        .insert({ ...p, created_at: nowIso() })
        .returning('id');
      const id = (row as { id: number }).id;
      if (lines.length > 0) await trx('delivery_proof_lines').insert(lines.map((l) => ({ proof_id: id, ...l })));
      for (const f of files) {
        await trx('delivery_files').insert({ proof_id: id, kind: f.kind, position: f.position, content_type: f.content_type, size: f.data.length, data: f.data, thumbnail: f.thumbnail, created_at: nowIso() });
      }
      return id;
    },

    async proofOf(orderId: number, trx: Db = db): Promise<ProofRow | undefined> {
      const row = await trx('delivery_proofs').where({ order_id: orderId }).first();
      return row ? { ...row, lat: row.lat === null ? null : Number(row.lat), lng: row.lng === null ? null : Number(row.lng), accuracy_m: row.accuracy_m === null ? null : Number(row.accuracy_m) } : undefined;
    },

    async proofLines(proofId: number): Promise<ProofLineRow[]> {
      return db('delivery_proof_lines').where({ proof_id: proofId }).select('order_line_id', 'sent', 'handed_over', 'short', 'damaged').orderBy('id');
    },

    async files(proofId: number): Promise<FileMeta[]> {
      return db('delivery_files').where({ proof_id: proofId }).select('id', 'kind', 'position', 'content_type', 'size').orderBy(['kind', 'position']);
    },

    async fileData(proofId: number, fileId: number | null, kind: 'signature' | 'photo', thumbnail: boolean): Promise<{ content_type: string; data: Buffer } | undefined> {
      const q = db('delivery_files').where({ proof_id: proofId, kind });
      if (fileId !== null) q.where({ id: fileId });
      const row = await q.first('content_type', thumbnail ? 'thumbnail as data' : 'data');
      if (!row || !row.data) return undefined;
      return { content_type: thumbnail ? 'image/webp' : (row.content_type as string), data: Buffer.from(row.data as Uint8Array) };
    },

    async taxRates(orgId: number, productIds: number[], trx: Db = db): Promise<Map<number, number>> {
      const rows = await trx('products').where('organisation_id', orgId).whereIn('id', productIds).select('id', 'tax_rate_bp');
      return new Map(rows.map((r) => [r.id as number, r.tax_rate_bp as number]));
    },

    async insertDraft(trx: Db, d: Omit<DraftRow, 'id' | 'created_at' | 'status' | 'credit_note_id'>): Promise<number> {
      const [row] = await trx('credit_note_drafts')
        .insert({ ...d, status: 'draft', lines: JSON.stringify(d.lines), created_at: nowIso() })
        .returning('id');
      return (row as { id: number }).id;
    },

    async draftOfProof(proofId: number): Promise<DraftRow | undefined> {
      const row = await db('credit_note_drafts').where({ proof_id: proofId }).first();
      return row ? { ...row, lines: JSON.parse(row.lines as string) as DraftLine[] } : undefined;
    },

    async draft(merchantOrgId: number, id: number): Promise<DraftRow | undefined> {
      const row = await db('credit_note_drafts').where({ merchant_organisation_id: merchantOrgId, id }).first();
      return row ? { ...row, lines: JSON.parse(row.lines as string) as DraftLine[] } : undefined;
    },

    async drafts(merchantOrgId: number, status: DraftRow['status']): Promise<DraftRow[]> {
      const rows = await db('credit_note_drafts').where({ merchant_organisation_id: merchantOrgId, status }).orderBy('id', 'desc').limit(200);
      return rows.map((row) => ({ ...row, lines: JSON.parse(row.lines as string) as DraftLine[] }));
    },

    /** Per run: when it was sent out, and how many of its pallets are ticked loaded. */
    async runProgress(slotIds: number[]): Promise<Map<number, { sent_out_at: string | null; loaded: number }>> {
      if (slotIds.length === 0) return new Map();
      const [sent, loaded] = await Promise.all([
        db('delivery_slots').whereIn('id', slotIds).select('id', 'sent_out_at'),
        db('run_loaded_pallets').whereIn('slot_id', slotIds).groupBy('slot_id').select('slot_id').count({ n: '*' }),
      ]);
      const counts = new Map((loaded as Record<string, unknown>[]).map((r) => [r.slot_id as number, Number(r.n)]));
      return new Map(sent.map((r) => [r.id as number, { sent_out_at: (r.sent_out_at as string | null) ?? null, loaded: counts.get(r.id as number) ?? 0 }]));
    },

    /** Moves a draft from one state to another only if it is still in the first; false when someone moved it first. */
    async moveDraft(id: number, from: DraftRow['status'], to: DraftRow['status'], creditNoteId: number | null = null): Promise<boolean> {
      return (await db('credit_note_drafts').where({ id, status: from }).update({ status: to, credit_note_id: creditNoteId })) > 0;
    },

    /** The day a follow-up order is wanted, and its merchant (to find its run). */
    async orderDay(orderId: number): Promise<{ requested_date: string; merchant_organisation_id: number } | undefined> {
      return db('orders').where({ id: orderId }).first('requested_date', 'merchant_organisation_id');
    },

    async branch(branchId: number): Promise<{ name: string; address: string | null; town: string | null; phone: string | null } | undefined> {
      return db('branches').where({ id: branchId }).first('name', 'address', 'town', 'phone');
    },

    async deck(lorryId: number): Promise<{ deck_length_mm?: number; deck_width_mm?: number } | undefined> {
      return db('lorries').where({ id: lorryId }).first();
    },

    /** The order's invoice of this merchant, with each line's packs and packs already credited. */
    async invoiceOfOrder(merchantOrgId: number, orderId: number): Promise<{ id: number; lines: { id: number; order_line_id: number | null; quantity: number; credited: number }[] } | undefined> {
      const invoice = await db('invoices').where({ order_id: orderId, merchant_organisation_id: merchantOrgId }).first('id');
      if (!invoice) return undefined;
      const lines = await db('invoice_lines as il')
        .where('il.invoice_id', invoice.id)
        .select('il.id', 'il.order_line_id', 'il.quantity', db.raw('coalesce((select sum(c.quantity) from credit_note_lines c where c.invoice_line_id = il.id), 0) as credited'));
      return { id: invoice.id as number, lines: lines.map((l) => ({ id: l.id as number, order_line_id: l.order_line_id as number | null, quantity: Number(l.quantity), credited: Number(l.credited) })) };
    },

    async latestCreditNote(invoiceId: number): Promise<number | null> {
      const note = await db('credit_notes').where({ invoice_id: invoiceId }).orderBy('id', 'desc').first('id');
      return (note?.id as number | undefined) ?? null;
    },

    async setDraftCreditNote(id: number, creditNoteId: number | null): Promise<void> {
      await db('credit_note_drafts').where({ id }).update({ credit_note_id: creditNoteId });
    },

    async cautionReads(slotIds: number[], userId: number): Promise<Map<number, string>> {
      if (slotIds.length === 0) return new Map();
      const rows = await db('run_caution_reads').whereIn('slot_id', slotIds).where({ user_id: userId }).select('slot_id', 'read_at');
      return new Map(rows.map((r) => [r.slot_id as number, r.read_at as string]));
    },

    /** The first acknowledgement stands: reading again does not move its time. */
    async readCautions(slotId: number, user: { id: number; name: string }): Promise<string> {
      const existing = await db('run_caution_reads').where({ slot_id: slotId, user_id: user.id }).first('read_at');
      if (existing) return existing.read_at as string;
      const at = nowIso();
      await db('run_caution_reads').insert({ slot_id: slotId, user_id: user.id, user_name: user.name, read_at: at });
      return at;
    },
  };
}

export type DeliveriesRepository = ReturnType<typeof deliveriesRepository>;
