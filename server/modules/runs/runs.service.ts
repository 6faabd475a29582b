import type { z } from 'zod';
import type { sendOutBodySchema } from '../../../shared/schemas/run.schema';
import type { AuthUser } from '../../auth/auth-user';
import type { Db } from '../../db/knex';
import { dayPlan, dayPlanJson, weekPlan } from './use-cases/day-plan';
import { setDropOrder } from './use-cases/drop-order';
import { palletView, setLoaded } from './use-cases/load-pallets';
import { runContext, type RunDeps } from './use-cases/run-context';
import { assertOrderMayLeave, sendOut } from './use-cases/send-out';

export type { RunDetail } from './run-assembly';

/**
 * The runs module's use cases over one shared context (repositories, the calendar, the run the caller
 * may see, the send-out rules); each lives in its own file under use-cases/, the run's assembly (deck
 * plan, pick list, pallet words) in run-assembly.ts.
 */
export function runsService(deps: RunDeps) {
  const ctx = runContext(deps);
  return {
    day: (user: AuthUser, branchId: number, date: string) => dayPlan(ctx, user, branchId, date),
    dayJson: dayPlanJson(ctx),
    get: async (user: AuthUser, id: number) => (await ctx.detail(user, id)).run,
    detail: ctx.detail,
    week: (user: AuthUser, branchId: number, from: string) => weekPlan(ctx, user, branchId, from),
    setDrops: (user: AuthUser, id: number, orderIds: number[]) => setDropOrder(ctx, user, id, orderIds),
    setLoaded: (user: AuthUser, id: number, index: number, loaded: boolean) => setLoaded(ctx, user, id, index, loaded),
    sendOut: (user: AuthUser, id: number, body: z.output<typeof sendOutBodySchema>) => sendOut(ctx, user, id, body),
    assertOrderMayLeave: (user: AuthUser, orderId: number, trx: Db) => assertOrderMayLeave(ctx, user, orderId, trx),
    pallet: (user: AuthUser, orderId: number, n: number) => palletView(ctx, user, orderId, n),
  };
}

export type RunsService = ReturnType<typeof runsService>;
