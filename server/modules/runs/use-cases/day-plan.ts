import { createHash } from 'node:crypto';
import { LRUCache } from 'lru-cache';
import { addDays } from '../../../../shared/domain/business-calendar';
import type { Run, RunWeek } from '../../../../shared/schemas/run.schema';
import type { AuthUser } from '../../../auth/auth-user';
import { peekRow } from '../../../db/knex';
import { assemble } from '../run-assembly';
import type { RunContext } from './run-context';

/** A branch's runs on one day (a driver's: only theirs). */
export async function dayPlan(ctx: RunContext, user: AuthUser, branchId: number, date: string): Promise<Run[]> {
  await ctx.branchOf(user, branchId);
  const rows = await ctx.repo.between(user.organisation.id, branchId, date, date, user.role === 'driver' ? user.id : undefined);
  return (await assemble(ctx.repo, rows)).map((d) => d.run);
}

/**
 * The day plan as JSON bytes with their ETag, from memory while nothing on it has changed. Day plans
 * are kept serialised under the merchant's two change counters (runs and order book, both kept by
 * triggers): the yard's board asks for the same day again and again, and it changes only when something
 * on it is written. Read only outside a transaction (see peekRow).
 */
export function dayPlanJson(ctx: RunContext) {
  const { db } = ctx;
  const days = new LRUCache<string, { body: Buffer; etag: string }>({ max: 200 });
  const versions = (orgId: number): string | null => {
    const run = peekRow<{ version: number }>(db, 'select version from run_versions where organisation_id = ?', orgId);
    const book = peekRow<{ version: number }>(db, 'select version from order_book_versions where organisation_id = ?', orgId);
    if (!run || !book) return null;
    return `${run.row?.version ?? 0}.${book.row?.version ?? 0}`;
  };
  return async (user: AuthUser, branchId: number, date: string): Promise<{ body: Buffer; etag: string }> => {
    const version = user.organisation.kind === 'merchant' ? versions(user.organisation.id) : null;
    const key = version ? `${user.organisation.id}:${branchId}:${date}:${user.role === 'driver' ? user.id : ''}:${version}` : null;
    const kept = key ? days.get(key) : undefined;
    if (kept !== undefined) return kept;
    const body = Buffer.from(JSON.stringify(await dayPlan(ctx, user, branchId, date)), 'utf8');
    const json = { body, etag: `W/"${body.length.toString(16)}-${createHash('sha1').update(body).digest('base64').slice(0, 27)}"` };
    if (key) days.set(key, json);
    return json;
  };
}

/** Seven days of a branch's runs from `from`, each run in brief, for the week view. */
export async function weekPlan(ctx: RunContext, user: AuthUser, branchId: number, from: string): Promise<RunWeek> {
  await ctx.branchOf(user, branchId);
  const to = addDays(from, 6);
  const rows = await ctx.repo.between(user.organisation.id, branchId, from, to, user.role === 'driver' ? user.id : undefined);
  const runs = await assemble(ctx.repo, rows);
  const days: RunWeek['days'] = [];
  for (let d = from; d <= to; d = addDays(d, 1)) {
    days.push({
      date: d,
      runs: runs
        .filter((r) => r.run.date === d)
        .map(({ run }) => ({
          id: run.id,
          time_window: run.time_window,
          lorry: { id: run.lorry.id, registration: run.lorry.registration, has_crane: run.lorry.has_crane },
          driver: run.driver,
          drops: run.drops.length,
          weight_kg: run.weight_kg,
          pallets: run.pallets,
          loaded_count: run.loaded_count,
          status: run.status,
        })),
    });
  }
  return { from, days };
}
