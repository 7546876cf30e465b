import type { RequestHandler } from 'express';
import { toNodeHandler } from 'better-auth/node';
import type { Auth } from '../auth.ts';
import { errorCodeForStatus } from '../errors.ts';

/**
 * The auth library's routes, with its error answers (`{ message, code }`, or no body at all)
 * rewritten into our envelope `{ error: { code, message }, requestId }`. Its headers (cookies,
 * Retry-After) are kept; successful answers pass through untouched.
 */
export function authHandler(auth: Auth): RequestHandler {
  return (req, res) =>
    toNodeHandler({
      handler: async (request: Request) => {
        const response = await auth.handler(request);
        return response.status >= 400 ? toEnvelope(response, String(req.id)) : response;
      },
    } as unknown as Auth)(req, res);
}

async function toEnvelope(response: Response, requestId: string): Promise<Response> {
  const raw = await response.text().catch(() => '');
  let body: { message?: unknown; code?: unknown } = {};
  try {
    const parsed: unknown = raw ? JSON.parse(raw) : {};
    if (parsed && typeof parsed === 'object') body = parsed as typeof body;
  } catch {
    // not JSON: the status alone tells what happened
  }
  const code = typeof body.code === 'string' && /^[A-Z0-9_]{1,64}$/i.test(body.code) ? body.code.toLowerCase() : errorCodeForStatus(response.status);
  // Its 4xx messages are for users ("Invalid email or password"); a 5xx message may describe internals.
  const message = response.status < 500 && typeof body.message === 'string' && body.message ? body.message : defaultMessage(response.status);
  const headers = new Headers(response.headers);
  headers.set('content-type', 'application/json; charset=utf-8');
  headers.delete('content-length');
  headers.delete('content-encoding');
  return new Response(JSON.stringify({ error: { code, message }, requestId }), { status: response.status, headers });
}

function defaultMessage(status: number) {
  if (status === 404) return 'No such sign-in route.';
  if (status === 429) return 'Too many attempts. Wait a minute and try again.';
  if (status >= 500) return 'Something went wrong on our side. Try again; if it keeps happening, quote the request id.';
  return 'The request could not be completed.';
}
