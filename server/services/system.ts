import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client.ts';
import { companies } from '../db/schema/index.ts';
import type { SearchClient } from '../search/client.ts';
import type { Actor } from '../policies/actor.ts';

/** Health and "who am I": the two questions every page asks first. */
export function createSystemService({ db, search }: { db: Db; search: SearchClient }) {
  return {
    /** Whether the database and the search engine answer; never throws. */
    async health() {
      const [dbUp, searchUp] = await Promise.all([db.execute(sql`select 1`).then(() => true, () => false), search.healthy()]);
      return { dbUp, searchUp };
    },

    /** The signed-in actor's company (null for none). Anyone signed in may ask about themselves. */
    async companyOf(actor: Actor) {
      if (!actor.companyId) return null;
      const [company] = await db.select({ id: companies.id, name: companies.name, kind: companies.kind }).from(companies).where(eq(companies.id, actor.companyId));
      return company ?? null;
    },
  };
}

export type SystemService = ReturnType<typeof createSystemService>;
