import type { Request } from 'express';
import type { Config } from '../config/env';

/**
 * The app address a browser should come back to after leaving for another site (the card payment
 * page): the address the request came from (its Origin, else its Referer) when that is one of the
 * app's allowed origins — or, outside production, the address the browser used to reach this server —
 * else APP_URL. Returning to the same address keeps the session cookie, which is tied to the host.
 */
export function returnBase(req: Request, config: Pick<Config, 'appUrl' | 'allowedOrigins' | 'isProduction'>): string {
  const from = originOf(req.get('origin')) ?? originOf(req.get('referer'));
  if (!from) return config.appUrl;
  if (config.allowedOrigins.includes(from)) return from;
  if (!config.isProduction) {
    const used = originOf(`${req.protocol}://${req.get('host') ?? ''}`);
    if (used && used === from) return from;
  }
  return config.appUrl;
}

function originOf(value: string | undefined): string | undefined {
  if (!value || value === 'null') return undefined;
  try {
    const u = new URL(value);
    return u.protocol === 'http:' || u.protocol === 'https:' ? u.origin : undefined;
  } catch {
    return undefined;
  }
}
