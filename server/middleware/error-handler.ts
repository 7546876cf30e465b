import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError, errorCodeForStatus } from '../errors.ts';

/** The only place that writes error responses: `{ error: { code, message, details? }, requestId }`. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const requestId = req.id ?? 'unknown';
  const known = toAppError(err);
  if (!known) {
    req.log?.error({ err }, 'unhandled error');
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Try again; if it keeps happening, quote the request id.' }, requestId });
    return;
  }
  if (known.status >= 500) req.log?.error({ err }, known.message);
  res.status(known.status).json({
    error: { code: known.code, message: known.message, ...(known.details === undefined ? {} : { details: known.details }) },
    requestId,
  });
};

/** Errors raised by Express's own body parsers and by the database, translated for clients. */
function toAppError(err: unknown): AppError | null {
  if (err instanceof AppError) return err;
  const e = err as { type?: string; status?: number; code?: string; cause?: { code?: string } };
  if (e?.type === 'entity.parse.failed') return new AppError(400, 'malformed_json', 'The request body is not valid JSON.');
  if (e?.type === 'entity.too.large') return new AppError(413, 'body_too_large', 'The request body is too large.');
  if (e?.type === 'encoding.unsupported' || e?.type === 'charset.unsupported')
    return new AppError(415, 'unsupported_encoding', 'Send the body as UTF-8 JSON.');
  if (e?.status === 404) return new AppError(404, 'not_found', 'Nothing was found at this address.');
  if (e?.status && e.status >= 400 && e.status < 500) return new AppError(e.status, errorCodeForStatus(e.status), 'The request could not be read.');
  if (searchUnreachable(err)) return new AppError(503, 'search_unavailable', 'Search is not reachable right now. Try again in a moment.');
  if (databaseDown(err) || (err as { body?: { code?: string } })?.body?.code === 'FAILED_TO_GET_SESSION')
    return new AppError(503, 'database_unavailable', 'The database is not reachable right now. Try again in a moment.');
  return null;
}

/**
 * The search server could not be reached or did not answer in time. The meilisearch client wraps
 * everything its transport throws in MeilisearchRequestError, so an error *answer* from the server
 * (MeilisearchApiError as the cause: a bad filter, a missing index) is not an outage.
 */
function searchUnreachable(err: unknown) {
  const e = err as { name?: string; cause?: { name?: string } } | undefined;
  if (e?.name === 'MeilisearchRequestTimeOutError' || e?.name === 'MeilisearchTaskTimeOutError') return true;
  return e?.name === 'MeilisearchRequestError' && e.cause?.name !== 'MeilisearchApiError';
}

/** Connection refused or reset, or PostgreSQL shutting down or starting, anywhere in the cause chain. */
function databaseDown(err: unknown) {
  const codes = new Set(['ECONNREFUSED', 'ECONNRESET', '57P01', '57P02', '57P03', '08000', '08003', '08006']);
  for (let e = err as { code?: string; cause?: unknown; message?: string } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    if (e.code && codes.has(e.code)) return true;
    if (e.message === 'Connection terminated unexpectedly' || e.message?.includes('Connection terminated')) return true;
  }
  return false;
}

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.originalUrl}.` }, requestId: req.id });
};

/** Anything outside /api that nothing served (no client build, or a method other than GET). */
export const notFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `Nothing at ${req.method} ${req.path}.` }, requestId: req.id });
};
