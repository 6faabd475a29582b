import type { Proposal, SubstituteFigures } from '../../../../shared/schemas/order.schema';
import type { Db } from '../../../db/knex';
import { nowIso } from '../../../db/time';

/** The desk's offers of changes on an order, their lines, and the contractor's answers. */
export function orderProposalsRepository(db: Db) {
  return {
    async insertProposal(
      trx: Db,
      p: {
        order_id: number;
        order_revision: number;
        message: string;
        proposed_date: string | null;
        proposed_time_window: string | null;
        proposed_slot_id: number | null;
        proposed_by: number;
      },
      lines: {
        order_line_id: number;
        confirmed_quantity: number;
        back_order_quantity: number;
        substitute_product_id: number | null;
        substitute_quantity: number | null;
        substitute_unit_price: number | null;
        substitute_figures: SubstituteFigures | null;
        note: string;
      }[],
    ): Promise<number> {
      const [row] = await trx('order_proposals')
        .insert({ ...p, status: 'open', proposed_at: nowIso() })
        .returning('id');
      const id = (row as { id: number }).id;
      if (lines.length > 0) {
        await trx('order_proposal_lines').insert(lines.map((l) => ({ ...l, substitute_figures: l.substitute_figures ? JSON.stringify(l.substitute_figures) : null, proposal_id: id })));
      }
      return id;
    },

    /** Open proposals made on an older revision no longer answer the order as it stands. */
    async supersedeOpenProposals(trx: Db, orderId: number): Promise<void> {
      await trx('order_proposals').where({ order_id: orderId, status: 'open' }).update({ status: 'superseded' });
    },

    async answerProposal(trx: Db, proposalId: number, status: 'accepted' | 'declined', userId: number): Promise<boolean> {
      const n = await trx('order_proposals').where({ id: proposalId, status: 'open' }).update({ status, answered_by: userId, answered_at: nowIso() });
      return n > 0;
    },

    async proposals(orderId: number, trx: Db = db): Promise<Proposal[]> {
      const rows = await trx('order_proposals as p')
        .leftJoin('users as pu', 'pu.id', 'p.proposed_by')
        .leftJoin('users as au', 'au.id', 'p.answered_by')
        .where('p.order_id', orderId)
        .select('p.*', 'pu.name as proposed_by_name', 'au.name as answered_by_name')
        .orderBy('p.id');
      if (rows.length === 0) return [];
      const lines = await trx('order_proposal_lines as pl')
        .join('order_lines as ol', 'ol.id', 'pl.order_line_id')
        .leftJoin('products as sp', 'sp.id', 'pl.substitute_product_id')
        .whereIn(
          'pl.proposal_id',
          rows.map((r) => r.id),
        )
        .select('pl.*', 'ol.sku', 'ol.description', 'ol.quantity', 'sp.sku as sub_sku', 'sp.name as sub_name', 'sp.unit as sub_unit', 'sp.pack_size as sub_pack_size')
        .orderBy('pl.id');
      return rows.map((r) => ({
        id: r.id,
        status: r.status,
        order_revision: r.order_revision,
        message: r.message,
        proposed_date: r.proposed_date,
        proposed_time_window: r.proposed_time_window,
        proposed_slot_id: r.proposed_slot_id,
        proposed_at: r.proposed_at,
        proposed_by: r.proposed_by ? { id: r.proposed_by, name: r.proposed_by_name } : null,
        answered_at: r.answered_at,
        answered_by: r.answered_by ? { id: r.answered_by, name: r.answered_by_name } : null,
        lines: lines
          .filter((l) => l.proposal_id === r.id)
          .map((l) => ({
            order_line_id: l.order_line_id,
            sku: l.sku,
            description: l.description,
            quantity: l.quantity,
            confirmed_quantity: l.confirmed_quantity,
            back_order_quantity: l.back_order_quantity,
            substitute: l.substitute_product_id
              ? {
                  product_id: l.substitute_product_id,
                  sku: l.sub_sku,
                  description: l.sub_name,
                  unit: l.sub_unit,
                  pack_size: l.sub_pack_size,
                  quantity: l.substitute_quantity,
                  unit_price: l.substitute_unit_price,
                  total: l.substitute_quantity * l.substitute_unit_price,
                  figures: l.substitute_figures ? (JSON.parse(l.substitute_figures) as SubstituteFigures) : null,
                }
              : null,
            note: l.note,
          })),
      }));
    },
  };
}
