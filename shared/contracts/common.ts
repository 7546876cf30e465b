import { z } from 'zod';
import { text } from './text.ts';
import { ROLES } from '../roles.ts';

export const ErrorEnvelopeSchema = z.object({
  error: z.object({
    code: text(),
    message: text(),
    details: z.unknown().optional(),
  }),
  requestId: text(),
});
export type ErrorEnvelope = z.infer<typeof ErrorEnvelopeSchema>;

export const RoleSchema = z.enum(ROLES);

export const CompanySchema = z.object({
  id: text(),
  name: text(),
  kind: z.enum(['wholesaler', 'installer']),
});
export type Company = z.infer<typeof CompanySchema>;

export const MeSchema = z.object({
  user: z.object({ id: text(), name: text(), email: text() }),
  role: RoleSchema,
  company: CompanySchema.nullable(),
  abilities: z.array(text()),
});
export type Me = z.infer<typeof MeSchema>;

export const HealthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  db: z.enum(['up', 'down']),
  search: z.enum(['up', 'down']),
});
export type Health = z.infer<typeof HealthSchema>;

export const PageQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

/** `:id` in a path. Services answer 404 for an id that names nothing (no 400 for a malformed one). */
export const IdParamsSchema = z.object({ id: text().min(1).max(64) });
