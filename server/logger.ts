import { pino, stdSerializers, type DestinationStream, type Logger } from 'pino';

/** Where secrets travel in a log line: request and response headers, and any field named like one. */
export const REDACT_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'req.headers["proxy-authorization"]',
  'req.headers["x-api-key"]',
  'res.headers["set-cookie"]',
  'headers.cookie',
  'headers.authorization',
  'err.headers',
  'err.config.headers',
  'password',
  'token',
  '*.password',
  '*.newPassword',
  '*.currentPassword',
  '*.token',
  '*.accessToken',
  '*.refreshToken',
  '*.idToken',
  '*.secret',
  '*.apiKey',
];

/** Query parameters that carry a secret (reset and verification links, callbacks). */
const SECRET_NAMES = 'token|code|secret|password|key|signature|access_token|refresh_token|id_token';
const SECRET_PARAM = new RegExp(`([?&](?:${SECRET_NAMES})=)[^&#]*`, 'gi');
const SECRET_KEY = new RegExp(`^(?:${SECRET_NAMES})$`, 'i');

export function redactUrl(url: string): string {
  return url.replace(SECRET_PARAM, '$1[Redacted]');
}

/**
 * A failed query's message carries its parameters ("params: …"), which may be a session token or
 * a password hash; keep the query, drop the values.
 */
export function redactErrorText(text: string): string {
  return text.replace(/(\bparams: )[^\n]*/g, '$1[Redacted]');
}

function errSerializer(err: Error) {
  const out = stdSerializers.err(err) as Record<string, unknown>;
  // A failed query keeps its parameters beside the message too.
  if ('params' in out) out.params = '[Redacted]';
  for (const key of ['message', 'stack']) if (typeof out[key] === 'string') out[key] = redactErrorText(out[key] as string);
  const cause = out.cause as Record<string, unknown> | undefined;
  if (cause && typeof cause === 'object') {
    for (const key of ['message', 'stack']) if (typeof cause[key] === 'string') cause[key] = redactErrorText(cause[key] as string);
  }
  return out;
}

/** For pino-http: its request serializer's output with secret query parameters masked. */
export const logSerializers = {
  req: (req: { url?: string; query?: Record<string, unknown> } & Record<string, unknown>) => ({
    ...req,
    url: req.url === undefined ? undefined : redactUrl(req.url),
    query: req.query && Object.fromEntries(Object.entries(req.query).map(([k, v]) => [k, SECRET_KEY.test(k) ? '[Redacted]' : v])),
  }),
  err: errSerializer,
};

/** The server's logger: secrets are redacted from every line, whoever writes it. */
export function createLogger(level: string, destination?: DestinationStream): Logger {
  const options = { level, redact: { paths: REDACT_PATHS, censor: '[Redacted]' }, serializers: { err: errSerializer } };
  return destination ? pino(options, destination) : pino(options);
}
