import { can } from '../../../shared/domain/policy';
import { ORDER_STATUS_LABELS, ORDER_STEPS, orderReference, stageAllows, type OrderStatus, type OrderStep } from '../../../shared/schemas/order.schema';
import type { AuthUser } from '../../auth/auth-user';
import { AppError } from '../../http/app-error';

type StagedOrder = { id: number; status: OrderStatus };

const stageWords = (o: StagedOrder) => ORDER_STATUS_LABELS[o.status].toLowerCase();

/** Why a step cannot be taken on an order in its stage, in words for the person who tried. */
function locked(order: StagedOrder, step: OrderStep): AppError {
  return AppError.conflict('order_locked', `Order ${orderReference(order.id)} is ${stageWords(order)}: it can no longer be ${step === 'cancel' ? 'cancelled' : 'changed'} here`);
}

/** Steps whose refusal in the wrong stage says more than "locked": what the step waits for. */
const STAGE_REFUSALS: Partial<Record<OrderStep, (order: StagedOrder) => AppError>> = {
  book_slot: (o) => AppError.conflict('order_not_confirmed', `Only a confirmed order can be booked onto a lorry; ${orderReference(o.id)} is ${stageWords(o)}`),
  release_slot: () => AppError.conflict('order_not_confirmed', 'The lorry has left: the booking can no longer change'),
  start_follow_up: (o) => AppError.conflict('order_not_confirmed', `${orderReference(o.id)} is ${stageWords(o)}: back-ordered packs follow once the order is confirmed`),
  deliver: (o) => AppError.conflict('order_not_on_the_road', `${orderReference(o.id)} is ${stageWords(o)}: a delivery is recorded once it is on the road`),
};

/** Refuses (403) a person whose side or role does not take this step, before the order is even looked up. */
export function assertTakesStep(user: Pick<AuthUser, 'role' | 'organisation'>, step: OrderStep): void {
  const s = ORDER_STEPS[step];
  if (user.organisation.kind !== s.by || !can(user.role, s.policy)) throw AppError.forbidden();
}

/** Refuses (409) a step on an order in a stage it does not start from, with that step's own code and words. */
export function assertStage(order: StagedOrder, step: OrderStep): void {
  if (!stageAllows(step, order.status)) throw (STAGE_REFUSALS[step] ?? ((o: StagedOrder) => locked(o, step)))(order);
}

/** The stage a step leaves the order in, or its own stage for a step that does not move it. */
export function nextStage(step: OrderStep, status: OrderStatus): OrderStatus {
  return ORDER_STEPS[step].to ?? status;
}
