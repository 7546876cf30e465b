import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Me } from '@shared/contracts/common.ts';
import type { Ability } from '@shared/roles.ts';
import { api, ApiError } from '@/lib/api-client.ts';

export const authKeys = { me: ['me'] as const };

/** The signed-in actor, or null when nobody is signed in. */
export async function getMe(): Promise<Me | null> {
  try {
    return (await api<{ data: Me }>('/me')).data;
  } catch (e) {
    if (e instanceof ApiError && e.status === 401) return null;
    throw e;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: authKeys.me, queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}

export function hasAbility(me: Me | null | undefined, ability: Ability) {
  return !!me?.abilities.includes(ability);
}
