import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { timeWindowSchema } from '../../../../shared/schemas/order.schema';
import { createSlotBodySchema, generateSlotsBodySchema } from '../../../../shared/schemas/slot.schema';

export const WEEKDAYS = [
  { day: 1, label: 'Mon' },
  { day: 2, label: 'Tue' },
  { day: 3, label: 'Wed' },
  { day: 4, label: 'Thu' },
  { day: 5, label: 'Fri' },
  { day: 6, label: 'Sat' },
  { day: 7, label: 'Sun' },
] as const;

export const weekdayField = (day: number) => `weekday.${day}`;
export const lorryChoiceField = (id: number) => `lorry.${id}`;

/** One slot: a lorry, a day and a window, with a driver if one is known already. */
export const slotFormSchema = z.pipe(
  z.pipe(
    z.record(z.string(), z.string()),
    z.transform((values): unknown => ({
      lorry_id: values.lorry_id ? Number(values.lorry_id) : undefined,
      date: values.date ?? '',
      time_window: (values.time_window ?? '').trim(),
      ...(values.driver_id ? { driver_id: Number(values.driver_id) } : {}),
    })),
  ),
  createSlotBodySchema,
);

/**
 * A run of slots: every window (typed as a comma list) for each ticked lorry (all of the branch's
 * when none is ticked) on each ticked weekday from the first day to the last.
 */
export function generateFormSchema(lorryIds: readonly number[]) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): unknown => {
        const windows = (values.windows ?? '')
          .split(/[,;\n]/)
          .map((w) => w.trim().replace(/\s*[–-]\s*/, '-'))
          .filter(Boolean);
        windows.forEach((w) => {
          const checked = timeWindowSchema.safeParse(w);
          if (!checked.success) ctx.addIssue({ code: 'custom', path: ['windows'], message: `"${w}": ${checked.error.issues[0]?.message ?? 'is not a time window'}` });
        });
        if (windows.length === 0) ctx.addIssue({ code: 'custom', path: ['windows'], message: 'give at least one time window, e.g. 07:30-12:00' });
        const weekdays = WEEKDAYS.filter((w) => values[weekdayField(w.day)] === 'on').map((w) => w.day);
        if (weekdays.length === 0) ctx.addIssue({ code: 'custom', path: ['weekdays'], message: 'tick at least one weekday' });
        const lorries = lorryIds.filter((id) => values[lorryChoiceField(id)] === 'on');
        return {
          from: values.from ?? '',
          to: values.to ?? '',
          windows,
          weekdays,
          ...(lorries.length ? { lorry_ids: lorries } : {}),
        };
      }),
    ),
    generateSlotsBodySchema,
  );
}
