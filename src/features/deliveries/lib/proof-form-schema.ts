import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { proofLineSchema, proofPositionSchema, recordProofBodySchema } from '../../../../shared/schemas/run.schema';
import type { DeliveryRecordFields } from './outbox-types';

/** At most this many photos go with one delivery, each at most PHOTO_MAX_BYTES. */
export const PHOTO_LIMIT = 6;
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;
export const PHOTO_TYPES: ReadonlySet<string> = new Set(['image/jpeg', 'image/png', 'image/webp']);

/** The delivery record as the server reads it, built from the shared contract's pieces. */
export const deliveryRecordFieldsSchema = z.object({
  receiver_name: z.string().check(z.trim(), z.minLength(1), z.maxLength(120)),
  note: z.string().check(z.trim(), z.maxLength(2000)),
  delivered_at: z.iso.datetime(),
  position: z.optional(proofPositionSchema),
  lines: z.array(proofLineSchema).check(z.minLength(1)),
});

export interface ProofLineInput {
  line_id: number;
  description: string;
  unit: string;
  /** Packs that went out on the lorry for this line. */
  quantity: number;
}

/** The three counts the driver gives per line, and how the messages name them. */
export const PACK_FIELDS = ['handed_over', 'short', 'damaged'] as const;
type PackField = (typeof PACK_FIELDS)[number];
const PACK_WORDS: Record<PackField, string> = { handed_over: 'handed over', short: 'short', damaged: 'damaged' };

/** The input of line `i`'s count, named by the path the server's errors come back on. */
export const packsField = (i: number, field: PackField) => `lines.${i}.${field}`;

const sameName = (a: string, b: string) => a.trim().replace(/\s+/g, ' ').toLowerCase() === b.trim().replace(/\s+/g, ' ').toLowerCase();

const megabytes = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

const text = (value: unknown) => (typeof value === 'string' ? value.trim() : '');

/** The checked form, as the shared delivery body has it, with what only the phone keeps (signature, photos, position). */
const checkedProofSchema = z.extend(z.pick(recordProofBodySchema, { receiver_name: true, note: true }), {
  lines: z.array(proofLineSchema).check(z.minLength(1)),
  signature_drawn: z.boolean(),
  typed_confirmation: z.string(),
  photos: z.array(z.instanceof(Blob)),
  use_position: z.boolean(),
});

/**
 * The proof-of-delivery form for one drop, read from its inputs by field path (`lines.0.short`): who
 * took it, a signature (or, for anyone who cannot use the signature box, the receiver's name typed
 * again to confirm), up to six photos of an allowed type and size, and per line the packs handed
 * over, short and damaged, which add up to what was sent; then the shared delivery body's own rules.
 * The signature and the photos live outside the inputs and come in as `signature_drawn` and `photos`.
 */
export function proofFormSchema(lines: readonly ProofLineInput[]) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.unknown()),
      transformWithIssues((values, ctx): z.input<typeof checkedProofSchema> => {
        const issue = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
        const receiver = text(values.receiver_name);
        if (receiver.length < 2) issue('receiver_name', 'name the person who took the delivery');
        else if (receiver.length > 120) issue('receiver_name', 'keep the name to 120 characters');
        const note = text(values.note);
        if (note.length > 2000) issue('note', 'keep the note under 2,000 characters');
        const signed = values.signature_drawn === true;
        const typed = text(values.typed_confirmation);
        if (!signed) {
          if (!typed) issue('typed_confirmation', "have the receiver sign in the box, or type the receiver's name here to confirm");
          else if (!sameName(typed, receiver)) issue('typed_confirmation', "type the receiver's name as given above");
        }
        const photos = Array.isArray(values.photos) ? values.photos.filter((p): p is Blob => p instanceof Blob) : [];
        if (photos.length > PHOTO_LIMIT) issue('photos', `at most ${PHOTO_LIMIT} photos: remove ${photos.length - PHOTO_LIMIT}`);
        photos.forEach((photo, i) => {
          if (photo.type && !PHOTO_TYPES.has(photo.type)) issue('photos', `photo ${i + 1} is not a JPEG, PNG or WebP picture`);
          else if (photo.size > PHOTO_MAX_BYTES) issue('photos', `photo ${i + 1} is ${megabytes(photo.size)}: at most 8 MB each`);
          else if (photo.size === 0) issue('photos', `photo ${i + 1} is empty: take it again`);
        });
        const counted = lines.map((line, i) => {
          const count = (field: PackField) => {
            const typedCount = text(values[packsField(i, field)]);
            if (/^\d+$/.test(typedCount)) return Number(typedCount);
            issue(packsField(i, field), /^-/.test(typedCount) ? `packs ${PACK_WORDS[field]} cannot be below 0` : `give the packs ${PACK_WORDS[field]} as a whole number`);
            return null;
          };
          const [handed_over, short, damaged] = PACK_FIELDS.map(count);
          if (handed_over !== null && short !== null && damaged !== null) {
            const total = handed_over + short + damaged;
            if (total !== line.quantity) issue(packsField(i, 'handed_over'), `${handed_over} handed over + ${short} short + ${damaged} damaged makes ${total}, but ${line.quantity} went out`);
          }
          return { line_id: line.line_id, handed_over: handed_over ?? 0, short: short ?? 0, damaged: damaged ?? 0 };
        });
        return { receiver_name: receiver, note, lines: counted, signature_drawn: signed, typed_confirmation: typed, photos, use_position: values.use_position === 'on' };
      }),
    ),
    checkedProofSchema,
  );
}

export type ProofFormValues = z.output<ReturnType<typeof proofFormSchema>>;

/** The record's fields from the checked form, the moment "Delivered" was pressed and the position if any. */
export function deliveryFields(values: ProofFormValues, deliveredAt: Date, position: DeliveryRecordFields['position'] | null): DeliveryRecordFields {
  return deliveryRecordFieldsSchema.parse({
    receiver_name: values.receiver_name,
    note: values.note ?? '',
    delivered_at: deliveredAt.toISOString(),
    ...(position ? { position } : {}),
    lines: values.lines.map(({ line_id, handed_over, short, damaged }) => ({ line_id, handed_over, short, damaged })),
  });
}
