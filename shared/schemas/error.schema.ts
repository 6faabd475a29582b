import { z } from 'zod';

/** Every error the API sends has this body. `details` carries field-level problems. */
export const errorDetailSchema = z
  .object({
    path: z.string().optional(),
    row: z.number().int().optional(),
    column: z.string().optional(),
    message: z.string(),
  })
  .catchall(z.unknown());

export const errorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.array(errorDetailSchema).optional(),
  }),
});

export type ErrorBody = z.infer<typeof errorBodySchema>;
export type ErrorDetail = z.infer<typeof errorDetailSchema>;
