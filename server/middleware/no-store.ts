import type { RequestHandler } from 'express';

/**
 * API answers carry one user's data: no browser, proxy or shared cache may keep them. Routes
 * with their own caching (stored media, the OpenAPI document) set their header after this one.
 */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('cache-control', 'no-store');
  next();
};
