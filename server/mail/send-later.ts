import type { Logger } from 'pino';

/**
 * Runs work that must not hold up the answer (sending e-mail, and for the reset request the whole
 * look-up) on a later turn of the event loop. A request that awaited it would answer faster or slower
 * depending on whether the address has an account, which tells the asker who has one. Failures are
 * logged, never thrown: the person asking has their answer already.
 */
export function runLater(logger: Logger, what: string, work: () => Promise<unknown>): void {
  setImmediate(() => {
    work().catch((err: unknown) => logger.error({ err }, `${what} failed`));
  });
}
