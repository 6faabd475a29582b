import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { createQuoteRequestBodySchema } from '../../../../shared/schemas/order.schema';
import type { CreateQuoteRequestBody } from '../../../../shared/schemas/order.schema';

export const branchField = (id: number) => `branch.${id}`;

/** The quote form read into the API body and checked with the shared schema; ticked branches become branch_ids. */
export function quoteFormSchema(estimateId: number) {
  return z.pipe(
    z.record(z.string(), z.string()),
    transformWithIssues((values, ctx): CreateQuoteRequestBody => {
      const branch_ids = Object.keys(values)
        .filter((key) => key.startsWith('branch.') && values[key] === 'on')
        .map((key) => Number(key.slice('branch.'.length)));
      const from = (values.time_window ?? '').trim();
      const to = (values.time_window_to ?? '').trim();
      if (Boolean(from) !== Boolean(to)) ctx.addIssue({ code: 'custom', path: ['time_window'], message: 'give the start and the end of the window, or neither' });
      const body = {
        estimate_id: estimateId,
        branch_ids,
        requested_date: values.requested_date ?? '',
        time_window: from && to ? `${from}-${to}` : null,
        delivery_method: values.delivery_method,
        notes: values.notes ?? '',
        po_reference: values.po_reference ?? '',
      };
      const checked = createQuoteRequestBodySchema.safeParse(body);
      if (!checked.success) {
        for (const issue of checked.error.issues) ctx.addIssue({ code: 'custom', path: [String(issue.path[0] ?? 'branch_ids')], message: issue.message });
        return z.NEVER;
      }
      return checked.data;
    }),
  );
}
