import type { Role, Ability } from '@shared/roles.ts';
import { can } from '@shared/roles.ts';
import { ForbiddenError } from '../errors.ts';

/** Who is asking: the signed-in user as the services see them. */
export interface Actor {
  userId: string;
  name: string;
  email: string;
  role: Role;
  companyId: string | null;
  /**
   * The request's session cookie, for the few calls the auth library makes in the actor's name
   * (its admin API checks the caller's session itself). Absent for actors made outside a request.
   */
  credentials?: Headers;
}

/** Every service calls this first, so no route can forget its role check. */
export function authorize(actor: Actor, ability: Ability) {
  if (!can(actor.role, ability)) throw new ForbiddenError();
}
