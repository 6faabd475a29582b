import { describe, expect, it } from 'vitest';
import { kindOfRole, ROLES, type Role } from '../../../shared/domain/roles';
import { ORDER_STATUSES, ORDER_STEPS, allowedOrderActions, stageAllows, stepAllowed, type OrderStatus, type OrderStep } from '../../../shared/schemas/order.schema';
import { AppError } from '../../http/app-error';
import { assertStage, assertTakesStep, nextStage } from './order-steps';

/**
 * The order's steps written out by hand, independently of ORDER_STEPS: which stages each starts
 * from, which roles take it, and where it leaves the order. A change to the table that is not made
 * here too fails these tests.
 */
const EXPECTED: Record<OrderStep, { from: OrderStatus[]; roles: Role[]; to: OrderStatus | null }> = {
  amend: { from: ['sent', 'changes_offered', 'agreed'], roles: ['contractor_owner', 'contractor_estimator'], to: 'sent' },
  cancel: { from: ['sent', 'changes_offered', 'agreed'], roles: ['contractor_owner', 'contractor_estimator'], to: 'cancelled' },
  accept_changes: { from: ['changes_offered'], roles: ['contractor_owner', 'contractor_estimator'], to: 'agreed' },
  decline_changes: { from: ['changes_offered'], roles: ['contractor_owner', 'contractor_estimator'], to: 'sent' },
  offer_changes: { from: ['sent', 'agreed'], roles: ['merchant_owner', 'merchant_sales'], to: 'changes_offered' },
  confirm: { from: ['sent', 'agreed'], roles: ['merchant_owner', 'merchant_sales'], to: 'confirmed' },
  turn_down: { from: ['sent', 'changes_offered', 'agreed'], roles: ['merchant_owner', 'merchant_sales'], to: 'turned_down' },
  dispatch: { from: ['confirmed'], roles: ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'], to: 'on_the_road' },
  deliver: { from: ['on_the_road'], roles: ['merchant_dispatcher', 'driver'], to: 'delivered' },
  book_slot: { from: ['confirmed'], roles: ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'], to: null },
  release_slot: { from: ['confirmed'], roles: ['merchant_owner', 'merchant_sales', 'merchant_dispatcher'], to: null },
  start_follow_up: { from: ['confirmed', 'on_the_road', 'delivered'], roles: ['merchant_owner', 'merchant_sales'], to: null },
};

const STEPS = Object.keys(EXPECTED) as OrderStep[];
const userOf = (role: Role) => ({ role, organisation: { id: 7, name: 'Harrowby Slate Yard', kind: kindOfRole(role) } });

function refusal(fn: () => void): AppError {
  try {
    fn();
  } catch (err) {
    if (err instanceof AppError) return err;
    throw err;
  }
  throw new Error('expected a refusal, got none');
}

describe('the table of order steps', () => {
  it('names exactly the steps written out here', () => {
    expect(Object.keys(ORDER_STEPS).sort()).toEqual([...STEPS].sort());
  });

  describe.each(STEPS)('%s', (step) => {
    const want = EXPECTED[step];

    it('starts from its stages only, and leaves the order in its next stage', () => {
      for (const status of ORDER_STATUSES) {
        expect(stageAllows(step, status), status).toBe(want.from.includes(status));
        if (want.from.includes(status)) expect(nextStage(step, status)).toBe(want.to ?? status);
      }
    });

    it('is taken by its roles only, and refuses every other role with 403 forbidden', () => {
      for (const role of ROLES) {
        if (want.roles.includes(role)) {
          expect(() => assertTakesStep(userOf(role), step), role).not.toThrow();
        } else {
          const err = refusal(() => assertTakesStep(userOf(role), step));
          expect([err.status, err.code], role).toEqual([403, 'forbidden']);
        }
      }
    });

    it('is allowed for a side, role and stage exactly when all three fit', () => {
      for (const role of ROLES) {
        for (const status of ORDER_STATUSES) {
          const allowed = want.roles.includes(role) && want.from.includes(status);
          expect(stepAllowed(step, status, kindOfRole(role), role), `${role} in ${status}`).toBe(allowed);
        }
      }
    });
  });

  it('lists as allowed actions only the stage changes the role may make in the stage', () => {
    expect(allowedOrderActions('sent', 'contractor', 'contractor_estimator')).toEqual(['amend', 'cancel']);
    expect(allowedOrderActions('changes_offered', 'contractor', 'contractor_owner')).toEqual(['amend', 'cancel', 'accept_changes', 'decline_changes']);
    expect(allowedOrderActions('sent', 'merchant', 'merchant_sales')).toEqual(['offer_changes', 'confirm', 'turn_down']);
    expect(allowedOrderActions('sent', 'merchant', 'merchant_dispatcher')).toEqual([]);
    expect(allowedOrderActions('confirmed', 'merchant', 'merchant_dispatcher')).toEqual(['dispatch']);
    expect(allowedOrderActions('on_the_road', 'merchant', 'driver')).toEqual(['deliver']);
    expect(allowedOrderActions('delivered', 'merchant', 'merchant_owner')).toEqual([]);
  });
});

describe('a step refused in the wrong stage', () => {
  const order = (status: OrderStatus) => ({ id: 42, status });

  it('says the order is locked, naming the order and its stage', () => {
    const err = refusal(() => assertStage(order('confirmed'), 'amend'));
    expect([err.status, err.code, err.message]).toEqual([409, 'order_locked', 'Order RL-000042 is confirmed: it can no longer be changed here']);
  });

  it('says a cancellation can no longer be made', () => {
    const err = refusal(() => assertStage(order('on_the_road'), 'cancel'));
    expect([err.status, err.code, err.message]).toEqual([409, 'order_locked', 'Order RL-000042 is on the road: it can no longer be cancelled here']);
  });

  it('answers a second confirmation and a turn-down of a confirmed order as locked', () => {
    expect(refusal(() => assertStage(order('confirmed'), 'confirm')).code).toBe('order_locked');
    expect(refusal(() => assertStage(order('cancelled'), 'turn_down')).code).toBe('order_locked');
    expect(refusal(() => assertStage(order('sent'), 'accept_changes')).code).toBe('order_locked');
  });

  it('tells the desk what booking, releasing and following up wait for', () => {
    expect(refusal(() => assertStage(order('sent'), 'book_slot')).message).toBe('Only a confirmed order can be booked onto a lorry; RL-000042 is sent to the merchant');
    expect(refusal(() => assertStage(order('on_the_road'), 'release_slot')).message).toBe('The lorry has left: the booking can no longer change');
    const followUp = refusal(() => assertStage(order('agreed'), 'start_follow_up'));
    expect([followUp.code, followUp.message]).toEqual(['order_not_confirmed', 'RL-000042 is changes agreed, waiting for confirmation: back-ordered packs follow once the order is confirmed']);
  });

  it('tells the driver a delivery waits for the order to be on the road', () => {
    const err = refusal(() => assertStage(order('confirmed'), 'deliver'));
    expect([err.status, err.code, err.message]).toEqual([409, 'order_not_on_the_road', 'RL-000042 is confirmed: a delivery is recorded once it is on the road']);
  });

  it('lets a step through in each of its stages', () => {
    for (const step of STEPS) for (const status of EXPECTED[step].from) expect(() => assertStage(order(status), step), `${step} in ${status}`).not.toThrow();
  });
});
