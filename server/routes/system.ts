import { z } from 'zod';
import { HealthSchema, MeSchema } from '@shared/contracts/common.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentHealth, presentMe } from '../presenters/system.ts';

export function systemRoutes(api: Api, { system }: Pick<AppDeps, 'system'>) {
  api.route({ method: 'get', path: '/health', summary: 'Database and search state', tag: 'system', ability: 'public', response: HealthSchema }, async ({ res }) => {
    const state = await system.health();
    res.status(state.dbUp ? 200 : 503);
    return presentHealth(state);
  });

  api.route({ method: 'get', path: '/me', summary: 'The signed-in user, role, company and abilities', tag: 'system', ability: 'signed-in', response: z.object({ data: MeSchema }) }, async ({ actor }) => ({
    data: presentMe(actor, await system.companyOf(actor)),
  }));
}
