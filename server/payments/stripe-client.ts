import Stripe from 'stripe';
import type { StripeConfig } from '../config/env';

/**
 * The official SDK, making the same calls everywhere: against the real service in production, and
 * against the local fake (STRIPE_API_BASE, plain HTTP on loopback) in development and tests.
 * Null when no key is configured: card payments then answer 503.
 */
export function createStripeClient(config: StripeConfig): Stripe | null {
  if (!config.secretKey) return null;
  if (!config.apiBase) return new Stripe(config.secretKey, { telemetry: false });
  const base = new URL(config.apiBase);
  return new Stripe(config.secretKey, {
    host: base.hostname,
    port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)),
    protocol: base.protocol === 'https:' ? 'https' : 'http',
    maxNetworkRetries: 0,
    telemetry: false,
  });
}
