import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { companies } from './companies.ts';
import { ranges } from './catalogue.ts';
import { user } from './auth.ts';

/** A saved stack plan: the request that produced it and a summary; the jobs work turns drafts into orders. */
export const stackPlans = pgTable(
  'stack_plans',
  {
    id: uuid().primaryKey().defaultRandom(),
    companyId: uuid()
      .notNull()
      .references(() => companies.id),
    name: text().notNull(),
    status: text({ enum: ['draft'] }).notNull().default('draft'),
    siteSuburb: text(),
    sitePostcode: text(),
    rangeId: uuid()
      .notNull()
      .references(() => ranges.id),
    request: jsonb().notNull(),
    /** Headline figures at the time of saving, for lists. */
    summary: jsonb().notNull(),
    createdBy: text()
      .notNull()
      .references(() => user.id),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index().on(t.companyId, t.createdAt)],
);
