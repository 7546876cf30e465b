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
}

/** Every service calls this first, so no route can forget its role check. */
export function authorize(actor: Actor, ability: Ability) {
  if (!can(actor.role, ability)) throw new ForbiddenError();
}
