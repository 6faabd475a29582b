import { z } from 'zod';
import { proofLineSchema, proofPositionSchema } from '../../../../shared/schemas/run.schema';
import type { DeliveryRecordFields } from './outbox-types';

/** At most this many photos go with one delivery, each at most PHOTO_MAX_BYTES. */
export const PHOTO_LIMIT = 6;
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;
export const PHOTO_TYPES: ReadonlySet<string> = new Set(['image/jpeg', 'image/png', 'image/webp']);

/** The delivery record as the server reads it, built from the shared contract's pieces. */
export const deliveryRecordFieldsSchema = z.object({
  receiver_name: z.string().trim().min(1).max(120),
  note: z.string().trim().max(2000),
  delivered_at: z.iso.datetime(),
  position: proofPositionSchema.optional(),
  lines: z.array(proofLineSchema).min(1),
});

export interface ProofLineInput {
  line_id: number;
  description: string;
  unit: string;
  /** Packs that went out on the lorry for this line. */
  quantity: number;
}

const packs = (what: string) =>
  z
    .number({ error: `give the packs ${what} as a whole number` })
    .int({ error: `give the packs ${what} as a whole number` })
    .min(0, { error: `packs ${what} cannot be below 0` });

/** The form's line: the shared proof line with plain words for what a driver gets wrong. */
const formLineSchema = proofLineSchema.extend({ handed_over: packs('handed over'), short: packs('short'), damaged: packs('damaged') });

const sameName = (a: string, b: string) => a.trim().replace(/\s+/g, ' ').toLowerCase() === b.trim().replace(/\s+/g, ' ').toLowerCase();

const megabytes = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/**
 * The proof-of-delivery form for one drop: who took it, a signature (or, for anyone who cannot use
 * the signature box, the receiver's name typed again to confirm), up to six photos of an allowed
 * type and size, and per line the packs handed over, short and damaged, which add up to what was sent.
 */
export function proofFormSchema(lines: readonly ProofLineInput[]) {
  return z
    .object({
      receiver_name: z.string().trim().min(2, { error: 'name the person who took the delivery' }).max(120, { error: 'keep the name to 120 characters' }),
      note: z.string().trim().max(2000, { error: 'keep the note under 2,000 characters' }),
      signature_drawn: z.boolean(),
      typed_confirmation: z.string().trim(),
      photos: z.array(z.instanceof(Blob)),
      lines: z.array(formLineSchema),
    })
    .superRefine((values, ctx) => {
      if (!values.signature_drawn) {
        if (!values.typed_confirmation) {
          ctx.addIssue({ code: 'custom', path: ['typed_confirmation'], message: "have the receiver sign in the box, or type the receiver's name here to confirm" });
        } else if (!sameName(values.typed_confirmation, values.receiver_name)) {
          ctx.addIssue({ code: 'custom', path: ['typed_confirmation'], message: "type the receiver's name as given above" });
        }
      }
      if (values.photos.length > PHOTO_LIMIT) {
        const extra = values.photos.length - PHOTO_LIMIT;
        ctx.addIssue({ code: 'custom', path: ['photos'], message: `at most ${PHOTO_LIMIT} photos: remove ${extra}` });
      }
      values.photos.forEach((photo, i) => {
        if (photo.type && !PHOTO_TYPES.has(photo.type)) {
          ctx.addIssue({ code: 'custom', path: ['photos'], message: `photo ${i + 1} is not a JPEG, PNG or WebP picture` });
        } else if (photo.size > PHOTO_MAX_BYTES) {
          ctx.addIssue({ code: 'custom', path: ['photos'], message: `photo ${i + 1} is ${megabytes(photo.size)}: at most 8 MB each` });
        } else if (photo.size === 0) {
          ctx.addIssue({ code: 'custom', path: ['photos'], message: `photo ${i + 1} is empty: take it again` });
        }
      });
      values.lines.forEach((line, i) => {
        const sent = lines.find((l) => l.line_id === line.line_id);
        if (!sent) {
          ctx.addIssue({ code: 'custom', path: ['lines', i, 'handed_over'], message: 'this line is not on the order' });
          return;
        }
        const total = line.handed_over + line.short + line.damaged;
        if (Number.isInteger(total) && total !== sent.quantity) {
          ctx.addIssue({
            code: 'custom',
            path: ['lines', i, 'handed_over'],
            message: `${line.handed_over} handed over + ${line.short} short + ${line.damaged} damaged makes ${total}, but ${sent.quantity} went out`,
          });
        }
      });
    });
}

export type ProofFormInput = z.input<ReturnType<typeof proofFormSchema>>;
export type ProofFormValues = z.output<ReturnType<typeof proofFormSchema>>;

/** The record's fields from the checked form, the moment "Delivered" was pressed and the position if any. */
export function deliveryFields(values: ProofFormValues, deliveredAt: Date, position: DeliveryRecordFields['position'] | null): DeliveryRecordFields {
  return deliveryRecordFieldsSchema.parse({
    receiver_name: values.receiver_name,
    note: values.note,
    delivered_at: deliveredAt.toISOString(),
    ...(position ? { position } : {}),
    lines: values.lines.map(({ line_id, handed_over, short, damaged }) => ({ line_id, handed_over, short, damaged })),
  });
}
