import type { RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';

const YEAR_S = 365 * 24 * 3600;

/**
 * The built client: the brotli or gzip copy made at build time when the browser accepts it (brotli
 * first), the plain file otherwise. Files under /assets/ carry a content hash in their name, so they
 * are cached for a year as immutable; everything else (index.html, the icon, the service worker)
 * is revalidated on each visit.
 */
export function clientAssets(dir: string): RequestHandler {
  return expressStaticGzip(dir, {
    enableBrotli: true,
    orderPreference: ['br', 'gz'],
    index: false,
    serveStatic: {
      setHeaders(res, path) {
        const hashed = /[/\\]assets[/\\][^/\\]+-[A-Za-z0-9_-]{8,}\.[a-z0-9]+(\.(br|gz))?$/.test(path);
        res.setHeader('Cache-Control', hashed ? `public, max-age=${YEAR_S}, immutable` : 'no-cache');
      },
    },
  }) as RequestHandler;
}
