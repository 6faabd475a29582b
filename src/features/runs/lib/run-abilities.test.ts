import { describe, expect, it } from 'vitest';
import { orderHrefFor, runAbilitiesFor } from './run-abilities';

describe('runAbilitiesFor', () => {
  it('lets the yard and the owner load, plan, send out and override; the desk plans and sends out; a driver only reads', () => {
    expect(runAbilitiesFor('merchant_dispatcher')).toEqual({ plan: true, load: true, sendOut: true, override: true });
    expect(runAbilitiesFor('merchant_owner')).toEqual({ plan: true, load: true, sendOut: true, override: true });
    expect(runAbilitiesFor('merchant_sales')).toEqual({ plan: true, load: false, sendOut: true, override: false });
    expect(runAbilitiesFor('driver')).toEqual({ plan: false, load: false, sendOut: false, override: false });
  });

  it('opens an order on the desk’s page for the desk and on the read-only page for the yard', () => {
    expect(orderHrefFor('merchant_sales')(15)).toBe('/desk/orders/15');
    expect(orderHrefFor('merchant_dispatcher')(15)).toBe('/yard/orders/15');
  });
});
