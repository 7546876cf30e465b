/** Errors a service may throw; the error handler is the only place that turns them into responses. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export class ValidationError extends AppError {
  constructor(message: string, details?: unknown) {
    super(400, 'validation_failed', message, details);
  }
}
export class UnauthenticatedError extends AppError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'unauthenticated', message);
  }
}
export class ForbiddenError extends AppError {
  constructor(message = 'Your role does not allow this.') {
    super(403, 'forbidden', message);
  }
}
export class NotFoundError extends AppError {
  constructor(what = 'That item') {
    super(404, 'not_found', `${what} was not found.`);
  }
}
export class ConflictError extends AppError {
  constructor(message: string, details?: unknown) {
    super(409, 'conflict', message, details);
  }
}

/** The envelope code for an error known only by its HTTP status (the auth library's, Node's, Express's). */
export function errorCodeForStatus(status: number): string {
  const codes: Record<number, string> = {
    400: 'bad_request',
    401: 'unauthenticated',
    403: 'forbidden',
    404: 'not_found',
    405: 'method_not_allowed',
    408: 'request_timeout',
    413: 'body_too_large',
    414: 'uri_too_long',
    415: 'unsupported_media_type',
    422: 'validation_failed',
    429: 'rate_limited',
    431: 'headers_too_large',
    503: 'unavailable',
  };
  return codes[status] ?? (status >= 500 ? 'internal' : 'bad_request');
}
