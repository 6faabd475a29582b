import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { parseForm } from '../../server/payments/stripe-fake';
import { createTestApp, type TestApp } from '../setup/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());
afterEach(() => {
  // Should a polluting parser ever come back, do not let it leak into the rest of the run.
  for (const k of ['x', 'polluted']) delete (Object.prototype as Record<string, unknown>)[k];
});

const post = (path: string, form: string) =>
  fetch(`${t.payments.url}${path}`, {
    method: 'POST',
    headers: { authorization: `Bearer ${t.config.stripe.secretKey}`, 'content-type': 'application/x-www-form-urlencoded' },
    body: form,
  });

describe('the local payment fake’s form parser cannot reach Object.prototype', () => {
  for (const form of ['__proto__[x]=y', 'constructor[prototype][x]=y', 'mode=payment&__proto__[polluted]=1&constructor[prototype][x]=y', '__proto__.x=y', 'metadata[__proto__][x]=y']) {
    it(`refuses ${form} with the provider's 400 and leaves every object clean`, async () => {
      const res = await post('/v1/checkout/sessions', form);
      expect(res.status).toBe(400);
      const body = (await res.json()) as { error: { type: string; code: string; message: string } };
      expect(body.error.type).toBe('invalid_request_error');
      expect(body.error.message).toMatch(/unknown parameter/);
      expect(({} as Record<string, unknown>).x).toBeUndefined();
      expect(({} as Record<string, unknown>).polluted).toBeUndefined();
      const res2 = await fetch(`${t.payments.url}/v1/checkout/sessions/cs_nothing?${form}`, { headers: { authorization: `Bearer ${t.config.stripe.secretKey}` } });
      expect(res2.status).toBe(400);
      expect(({} as Record<string, unknown>).x).toBeUndefined();
    });
  }

  it('parses the bracket format the SDK writes into nested objects and arrays', () => {
    const parsed = parseForm('mode=payment&line_items[0][price_data][currency]=gbp&line_items[0][quantity]=2&line_items[1][quantity]=1&metadata[invoice_id]=7');
    expect(JSON.parse(JSON.stringify(parsed))).toEqual({
      mode: 'payment',
      line_items: [{ price_data: { currency: 'gbp' }, quantity: '2' }, { quantity: '1' }],
      metadata: { invoice_id: '7' },
    });
    expect(Object.getPrototypeOf(parsed)).toBeNull();
  });

  it('throws on prototype keys when called directly', () => {
    expect(() => parseForm('constructor[prototype][x]=y')).toThrow(/unknown parameter/);
    expect(({} as Record<string, unknown>).x).toBeUndefined();
  });
});
