import { orderReference } from '../../../../shared/schemas/order.schema';
import type { AppDeps } from '../../../app-deps';
import type { AuthUser } from '../../../auth/auth-user';
import type { Db } from '../../../db/knex';
import { AppError } from '../../../http/app-error';
import { ordersRepository } from '../../orders/orders.repository';
import { priceListRepository } from '../../price-list/price-list.repository';
import { assemble, type RunDetail } from '../run-assembly';
import { runsRepository, type RunRow } from '../runs.repository';

export type RunDeps = Pick<AppDeps, 'db' | 'config' | 'mailer' | 'logger'>;

export function invalid(path: string, message: string): AppError {
  return AppError.unprocessable('validation_failed', 'Some fields are not valid', [{ path, message }]);
}

/** What every use case of the runs module shares: the repositories, the calendar, and the run the caller may see. */
export function runContext(deps: RunDeps) {
  const { db, config } = deps;
  const repo = runsRepository(db);
  const orders = ordersRepository(db);
  const branches = priceListRepository(db);
  const today = () => config.calendar.today();

  async function branchOf(user: AuthUser, branchId: number) {
    if (user.organisation.kind !== 'merchant' || !(await branches.branch(user.organisation.id, branchId))) throw AppError.notFound('Branch');
  }

  /** The run, if the user may see it: the merchant's own, and for a driver only a run assigned to them. */
  async function runOf(user: AuthUser, id: number, trx: Db = db): Promise<RunRow> {
    const row = user.organisation.kind === 'merchant' ? await repo.find(user.organisation.id, id, trx) : undefined;
    if (!row) throw AppError.notFound('Run');
    if (user.role === 'driver' && row.driver_user_id !== user.id) throw AppError.forbidden('A driver sees only the runs assigned to them');
    return row;
  }

  async function detail(user: AuthUser, id: number, trx?: Db): Promise<RunDetail> {
    return (await assemble(repo, [await runOf(user, id, trx)], trx))[0];
  }

  /**
   * The rules for a run (or some of its orders) to leave the yard: its day is today in the business
   * calendar and every pallet of those orders is ticked loaded. 409 not_today / not_loaded otherwise.
   */
  function readiness(d: RunDetail, orderIds: readonly number[]): { code: 'not_today' | 'not_loaded'; message: string } | null {
    if (d.row.date !== today()) {
      return { code: 'not_today', message: `${d.row.registration}'s run is on ${d.row.date}; today is ${today()}: it goes out on its day` };
    }
    const missing = d.deck.positions.filter((p) => orderIds.includes(p.order_id) && !p.loaded);
    if (missing.length > 0) {
      const names = missing.slice(0, 6).map((p) => `pallet ${p.pallet} of ${orderReference(p.order_id)}`);
      return { code: 'not_loaded', message: `${missing.length} pallet${missing.length === 1 ? ' is' : 's are'} not ticked loaded: ${names.join(', ')}${missing.length > 6 ? ', …' : ''}` };
    }
    return null;
  }

  return { deps, db, repo, orders, today, branchOf, runOf, detail, readiness };
}

export type RunContext = ReturnType<typeof runContext>;
