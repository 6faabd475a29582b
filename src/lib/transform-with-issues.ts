import * as z from 'zod/mini';

/**
 * zod/mini's `z.transform` with the context a classic transform has: `ctx.addIssue` records an issue
 * (code "custom" and the input given when left out) and the function returns `z.NEVER` to stop. The
 * form schemas read their raw inputs this way, so they keep their messages without zod's classic API.
 */
export function transformWithIssues<I, O>(fn: (input: I, ctx: z.core.$RefinementCtx<I>) => O): z.ZodMiniTransform<Awaited<O>, I> {
  return z.transform<I, O>((input, payload) => {
    const ctx = payload as z.core.$RefinementCtx<I>;
    ctx.addIssue = (issue) => {
      if (typeof issue === 'string') {
        payload.issues.push({ code: 'custom', message: issue, input });
        return;
      }
      const raw: { -readonly [K in keyof z.core.$ZodRawIssue]?: z.core.$ZodRawIssue[K] } & { fatal?: boolean } = { ...issue };
      if (raw.fatal) raw.continue = false;
      raw.code ??= 'custom';
      if (!('input' in raw)) raw.input = input;
      payload.issues.push(raw as z.core.$ZodRawIssue);
    };
    return fn(input, ctx);
  });
}
