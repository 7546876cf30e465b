import type { RequestHandler } from 'express';
import { AppError } from '../errors.ts';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses state-changing requests that a browser sent from another site. Requests without
 * an Origin (scripts, integrations) carry no ambient cookies from a victim's browser.
 */
export function originCheck(allowedOrigins: string[]): RequestHandler {
  const allowed = new Set(allowedOrigins);
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    const site = req.get('sec-fetch-site');
    if (origin && !allowed.has(origin)) return next(new AppError(403, 'bad_origin', 'This request came from a site Stackyard does not trust.'));
    if (!origin && site === 'cross-site') return next(new AppError(403, 'bad_origin', 'Cross-site requests are not accepted.'));
    next();
  };
}
