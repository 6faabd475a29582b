import type { QUOTE_REQUEST_STATUSES } from '../../../shared/schemas/order.schema';

/** A quote request's stage in words, on either side's list. */
export const REQUEST_STAGE_WORDS: Record<(typeof QUOTE_REQUEST_STATUSES)[number], string> = { open: 'Open', accepted: 'Accepted', withdrawn: 'Withdrawn' };
