import * as z from 'zod/mini';
import { transformWithIssues } from '../../../lib/transform-with-issues';
import { updateSlotBodySchema } from '../../../../shared/schemas/slot.schema';

/** What a slot holds now that the change form may alter. */
export interface SlotNow {
  time_window: string;
  driver_id: number | null;
}

/** "12:30 - 16:30" and "12:30–16:30" read as "12:30-16:30"; the schema then checks the window. */
export const normaliseWindow = (text: string | undefined) => (text ?? '').trim().replace(/\s*[–-]\s*/, '-');

/**
 * The slot change form read into the PATCH body: only what differs from the slot now is sent, so
 * an untouched window is never re-sent (the server would check it against the lorry's other slots).
 */
export function slotChangeFormSchema(now: SlotNow) {
  return z.pipe(
    z.pipe(
      z.record(z.string(), z.string()),
      transformWithIssues((values, ctx): unknown => {
        const body: { time_window?: string; driver_id?: number | null } = {};
        const window = normaliseWindow(values.time_window);
        if (window !== now.time_window) body.time_window = window;
        const driver = values.driver_id ? Number(values.driver_id) : null;
        if (driver !== now.driver_id) body.driver_id = driver;
        if (Object.keys(body).length === 0) ctx.addIssue({ code: 'custom', path: [], message: 'Nothing is changed yet: give a new time window or choose another driver.' });
        return body;
      }),
    ),
    updateSlotBodySchema,
  );
}
