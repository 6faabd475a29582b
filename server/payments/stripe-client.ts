import type Stripe from 'stripe';
import type { StripeConfig } from '../config/env';

/** The payment SDK, made on the first call that needs it: loaded, it holds about 20 MB. */
export interface StripeClient {
  get(): Promise<Stripe>;
}

/**
 * The official SDK, making the same calls everywhere: against the real service in production, and
 * against the local fake (STRIPE_API_BASE, plain HTTP on loopback) in development and tests.
 * Null when no key is configured: card payments then answer 503.
 */
export function createStripeClient(config: StripeConfig): StripeClient | null {
  const secretKey = config.secretKey;
  if (!secretKey) return null;
  let client: Promise<Stripe> | undefined;
  return {
    get() {
      client ??= import('stripe').then(({ default: StripeSdk }) => {
        if (!config.apiBase) return new StripeSdk(secretKey, { telemetry: false });
        const base = new URL(config.apiBase);
        return new StripeSdk(secretKey, {
          host: base.hostname,
          port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)),
          protocol: base.protocol === 'https:' ? 'https' : 'http',
          maxNetworkRetries: 0,
          telemetry: false,
        });
      });
      client.catch(() => {
        client = undefined;
      });
      return client;
    },
  };
}
