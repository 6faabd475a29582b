import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { answerQuoteBodySchema } from '../../../../shared/schemas/order.schema';
import type { AnswerQuoteBody, QuoteRequest } from '../../../../shared/schemas/order.schema';
import { readMoneyEntry } from '../../../../shared/domain/money-entry';
import { ApiError, isApiError } from '../../../lib/api-client';

type RequestLine = QuoteRequest['lines'][number];

export const answerField = (i: number, name: 'product' | 'packs' | 'price' | 'note') => `answer.${i}.${name}`;

/**
 * The desk's answer read into the answer body: each request line the branch offers names a product,
 * and may override the packs (else enough packs for the quantity asked) and the pack price in the
 * configured currency (else the branch's price). Lines without a product are not offered.
 */
export function answerFormSchema(lines: readonly Pick<RequestLine, 'id'>[], currency: string) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): AnswerQuoteBody => {
        const offered: AnswerQuoteBody['lines'] = [];
        lines.forEach((line, i) => {
          const product = (values[answerField(i, 'product')] ?? '').trim();
          const packsText = (values[answerField(i, 'packs')] ?? '').trim();
          const priceText = (values[answerField(i, 'price')] ?? '').trim();
          const note = (values[answerField(i, 'note')] ?? '').trim();
          if (!product) {
            if (packsText || priceText) ctx.addIssue({ code: 'custom', path: [answerField(i, 'product')], message: 'choose the product this price is for' });
            return;
          }
          let packs: number | undefined;
          if (packsText) {
            if (!/^\d+$/.test(packsText) || Number(packsText) < 1) {
              ctx.addIssue({ code: 'custom', path: [answerField(i, 'packs')], message: 'give a whole number of packs (at least 1)' });
              return;
            }
            packs = Number(packsText);
          }
          let unitPrice: number | undefined;
          if (priceText) {
            const price = readMoneyEntry(priceText, currency, `the pack price of line ${i + 1}`);
            if (!price.ok) {
              ctx.addIssue({ code: 'custom', path: [answerField(i, 'price')], message: price.message });
              return;
            }
            unitPrice = price.minor;
          }
          offered.push({
            request_line_id: line.id,
            product_id: Number(product),
            ...(packs !== undefined ? { packs } : {}),
            ...(unitPrice !== undefined ? { unit_price: unitPrice } : {}),
            ...(note ? { note } : {}),
          });
        });
        const message = (values.message ?? '').trim();
        const validUntil = (values.valid_until ?? '').trim();
        return { lines: offered, ...(validUntil ? { valid_until: validUntil } : {}), ...(message ? { message } : {}) };
      }),
    ),
    answerQuoteBodySchema,
  );
}

const FIELD_OF: Record<string, 'product' | 'packs' | 'price' | 'note'> = { product_id: 'product', packs: 'packs', unit_price: 'price', note: 'note' };

/**
 * The server names a refused line by its place in the lines sent (`lines.1.unit_price`), which skips
 * the lines not offered; this points the error back at the row of the form it came from.
 */
export function onAnswerForm(error: unknown, body: AnswerQuoteBody, lines: readonly Pick<RequestLine, 'id'>[]): unknown {
  if (!isApiError(error) || error.details.length === 0) return error;
  const details = error.details.map((detail) => {
    const match = /^lines\.(\d+)\.(\w+)$/.exec(detail.path ?? '');
    const sent = match ? body.lines[Number(match[1])] : undefined;
    const row = sent ? lines.findIndex((l) => l.id === sent.request_line_id) : -1;
    const field = match ? FIELD_OF[match[2]] : undefined;
    return row >= 0 && field ? { ...detail, path: answerField(row, field) } : detail;
  });
  return new ApiError(error.status, error.code, error.message, details);
}
