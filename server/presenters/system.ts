import type { Company, Health, Me } from '@shared/contracts/common.ts';
import { abilitiesOf } from '@shared/roles.ts';
import type { Actor } from '../policies/actor.ts';

export function presentHealth({ dbUp, searchUp }: { dbUp: boolean; searchUp: boolean }): Health {
  return { status: dbUp && searchUp ? 'ok' : 'degraded', db: dbUp ? 'up' : 'down', search: searchUp ? 'up' : 'down' };
}

export function presentMe(actor: Actor, company: Company | null): Me {
  return {
    user: { id: actor.userId, name: actor.name, email: actor.email },
    role: actor.role,
    company,
    abilities: abilitiesOf(actor.role),
  };
}
