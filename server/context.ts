import path from 'node:path';
import type { Env } from './env.ts';
import { createDb } from './db/client.ts';
import { createLogger } from './logger.ts';
import { createAuth } from './auth.ts';
import { createSearchClient } from './search/client.ts';
import { localSecret } from './local-secret.ts';
import type { AppOptions } from './deps.ts';
import { createLocalFileStore } from './storage/files.ts';
import { createPaymentProvider, DEV_PAY_PORT, STANDIN_SECRET_KEY, STANDIN_WEBHOOK_SECRET } from './payments/provider.ts';

/** Everything createApp needs, built from the environment (server, CLI tasks and benchmarks share it). */
export function buildContext(env: Env): AppOptions {
  const logger = createLogger(env.LOG_LEVEL);
  const publicUrl = env.PUBLIC_URL ?? `http://${env.HOST === '0.0.0.0' ? '127.0.0.1' : env.HOST}:${env.PORT}`;
  // Local addresses are trusted only for a local run; with PUBLIC_URL set, only that origin is.
  const trustedOrigins = env.PUBLIC_URL ? [env.PUBLIC_URL] : [...new Set([publicUrl, `http://localhost:${env.PORT}`, `http://127.0.0.1:${env.PORT}`])];
  const db = createDb(env.DATABASE_URL);
  const auth = createAuth({
    db,
    baseURL: publicUrl,
    secret: env.AUTH_SECRET ?? localSecret(env.DATA_DIR),
    trustedOrigins,
    signInLimitPerMinute: env.SIGN_IN_LIMIT_PER_MINUTE,
    logger,
  });
  const search = createSearchClient({ host: env.MEILI_HOST ?? 'http://127.0.0.1:7701', apiKey: env.MEILI_API_KEY });
  return { trustProxy: trustProxySetting(env.TRUST_PROXY), db, auth, search, files: createLocalFileStore(path.resolve(env.DATA_DIR)), logger, trustedOrigins, clientDir: path.resolve(env.CLIENT_DIR), quoteHoldDays: env.QUOTE_HOLD_DAYS, appUrl: publicUrl, payment: paymentConfig(env) };
}

/** The real provider when its keys are set (and no STRIPE_API_BASE); otherwise the local stand-in with its own keys. */
export function paymentConfig(env: Env) {
  const real = Boolean(env.STRIPE_SECRET_KEY) && !env.STRIPE_API_BASE;
  const secretKey = env.STRIPE_SECRET_KEY ?? STANDIN_SECRET_KEY;
  const webhookSecret = env.STRIPE_WEBHOOK_SECRET ?? STANDIN_WEBHOOK_SECRET;
  if (real && !env.STRIPE_WEBHOOK_SECRET) throw new Error('STRIPE_WEBHOOK_SECRET must be set with STRIPE_SECRET_KEY (the provider shows it beside the webhook endpoint).');
  return { provider: createPaymentProvider({ secretKey, webhookSecret, apiBase: real ? undefined : (env.STRIPE_API_BASE ?? `http://127.0.0.1:${DEV_PAY_PORT}`) }), webhookSecret };
}

/** SMTP_URL, or the local stand-in on SMTP_PORT. */
export function smtpUrl(env: Env) {
  return env.SMTP_URL ?? `smtp://127.0.0.1:${env.SMTP_PORT}`;
}

/**
 * TRUST_PROXY as Express's "trust proxy": a hop count ("1"), "true"/"false", or addresses and
 * names ("loopback", "10.0.0.0/8, 10.1.2.3"). Unset: no forwarded address is believed.
 */
export function trustProxySetting(value: string | undefined): string | number | boolean {
  const v = value?.trim();
  if (!v || v === 'false') return false;
  if (v === 'true') return true;
  return /^\d+$/.test(v) ? Number(v) : v;
}
