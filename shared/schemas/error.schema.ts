// zod/mini, like auth.schema.ts: the one fetch client reads every error with it, the sign-in page included.
import './zod-messages';
import * as z from 'zod/mini';

/** Every error the API sends has this body. `details` carries field-level problems. */
export const errorDetailSchema = z.catchall(
  z.object({
    path: z.optional(z.string()),
    row: z.optional(z.int()),
    column: z.optional(z.string()),
    message: z.string(),
  }),
  z.unknown(),
);

export const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.optional(z.array(errorDetailSchema)),
  }),
});

export type ErrorBody = z.infer<typeof errorBodySchema>;
export type ErrorDetail = z.infer<typeof errorDetailSchema>;
