import { sql } from 'drizzle-orm';
import { z } from 'zod';
import { HealthSchema, MeSchema } from '@shared/contracts/common.ts';
import { abilitiesOf } from '@shared/roles.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../app.ts';
import { eq } from 'drizzle-orm';
import { companies } from '../db/schema/index.ts';

export function systemRoutes(api: Api, { db, search }: AppDeps) {
  api.route({ method: 'get', path: '/health', summary: 'Database and search state', tag: 'system', ability: 'public', response: HealthSchema }, async ({ res }) => {
    const [dbUp, searchUp] = await Promise.all([
      db.execute(sql`select 1`).then(() => true, () => false),
      search.healthy(),
    ]);
    const health = { status: dbUp && searchUp ? 'ok' : 'degraded', db: dbUp ? 'up' : 'down', search: searchUp ? 'up' : 'down' } as const;
    res.status(dbUp ? 200 : 503);
    return health;
  });

  api.route({ method: 'get', path: '/me', summary: 'The signed-in user, role, company and abilities', tag: 'system', ability: 'signed-in', response: z.object({ data: MeSchema }) }, async ({ actor }) => {
    const [company] = actor.companyId
      ? await db.select({ id: companies.id, name: companies.name, kind: companies.kind }).from(companies).where(eq(companies.id, actor.companyId))
      : [];
    return {
      data: {
        user: { id: actor.userId, name: actor.name, email: actor.email },
        role: actor.role,
        company: company ?? null,
        abilities: abilitiesOf(actor.role),
      },
    };
  });
}
