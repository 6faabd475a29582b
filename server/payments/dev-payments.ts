import { randomBytes } from 'node:crypto';
import type { Config } from '../config/env';
import { startStripeFake, type StripeFake } from './stripe-fake';

/** The path of the app's webhook route for payment events. */
export const PAYMENT_WEBHOOK_PATH = '/api/payments/webhook';

/**
 * Starts the local payment fake for development or tests and returns the config that points the SDK
 * at it, with a key and signing secret made for this run. The webhook URL is set once the app listens.
 */
export async function startDevPayments(config: Config, port = config.stripe.devPort): Promise<{ fake: StripeFake; config: Config }> {
  const secretKey = `sk_test_local_${randomBytes(12).toString('hex')}`;
  const webhookSecret = `whsec_local_${randomBytes(16).toString('hex')}`;
  const fake = await startStripeFake({ secretKey, webhookSecret, port });
  return { fake, config: { ...config, stripe: { ...config.stripe, secretKey, webhookSecret, apiBase: fake.url } } };
}
