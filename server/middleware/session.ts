import type { RequestHandler } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { ROLES, type Role } from '@shared/roles.ts';
import type { Auth } from '../auth.ts';
import type { Actor } from '../policies/actor.ts';
import { createTtlCache, type TtlCache } from '../lib/ttl-cache.ts';

/** How long a checked session is trusted without asking the database again (per instance). */
export const SESSION_CACHE_MS = 3_000;

/** better-auth's session cookie (with the __Secure- prefix on https). */
const SESSION_COOKIE = /(?:^|;\s*)(?:__Secure-)?better-auth\.session_token=([^;]+)/;

export function createSessionCache(): TtlCache<Actor | null> {
  return createTtlCache<Actor | null>(SESSION_CACHE_MS, { keep: (actor) => actor !== null });
}

/**
 * Loads the signed-in user (if any) as `req.actor`; routes decide whether one is required.
 * Requests without a session cookie skip the check entirely. A checked cookie is remembered
 * for a few seconds; sign-out, deactivation, role and password changes clear the memory at once.
 */
export function sessionMiddleware(auth: Auth, cache: TtlCache<Actor | null>): RequestHandler {
  return async (req, _res, next) => {
    const token = SESSION_COOKIE.exec(req.headers.cookie ?? '')?.[1];
    if (!token) return next();
    const actor = await cache.get(token, () => lookUp(auth, req.headers));
    if (actor) req.actor = actor;
    next();
  };
}

async function lookUp(auth: Auth, headers: import('node:http').IncomingHttpHeaders): Promise<Actor | null> {
  const found = await auth.api.getSession({ headers: fromNodeHeaders(headers) });
  if (!found || found.user.banned) return null;
  const role = (ROLES as readonly string[]).includes(found.user.role ?? '') ? (found.user.role as Role) : 'installer';
  return {
    userId: found.user.id,
    name: found.user.name,
    email: found.user.email,
    role,
    companyId: (found.user as { companyId?: string | null }).companyId ?? null,
    // Only the cookie: the actor is remembered per session token, and that is all the cookie holds.
    credentials: new Headers({ cookie: headers.cookie ?? '' }),
  };
}
