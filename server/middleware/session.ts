import type { RequestHandler } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { ROLES, type Role } from '@shared/roles.ts';
import type { Auth } from '../auth.ts';

/** Loads the signed-in user (if any) as `req.actor`; routes decide whether one is required. */
export function sessionMiddleware(auth: Auth): RequestHandler {
  return async (req, _res, next) => {
    const found = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
    if (found && !found.user.banned) {
      const role = (ROLES as readonly string[]).includes(found.user.role ?? '') ? (found.user.role as Role) : 'installer';
      req.actor = {
        userId: found.user.id,
        name: found.user.name,
        email: found.user.email,
        role,
        companyId: (found.user as { companyId?: string | null }).companyId ?? null,
      };
    }
    next();
  };
}
