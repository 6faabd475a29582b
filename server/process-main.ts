import { ConfigError } from './config/env';
import { sourceMappedStack } from './logger';

/**
 * Runs a process's start-up (the server, the mail worker). A configuration problem prints its own
 * message alone, anything else its stack mapped to the TypeScript lines; either ends the process with 1.
 */
export function runMain(main: () => Promise<void>): void {
  main().catch((err: unknown) => {
    console.error(err instanceof ConfigError ? err.message : err instanceof Error && err.stack ? sourceMappedStack(err.stack) : err);
    process.exit(1);
  });
}

/** On SIGINT or SIGTERM, lets `close` finish what is in flight and close what the process opened, then exits cleanly. */
export function exitOnSignal(close: () => Promise<void>): void {
  const stop = async () => {
    await close();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}
