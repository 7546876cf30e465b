import { z } from 'zod';
import { text } from './text.ts';
import { RoleSchema } from './common.ts';

export const UserRowSchema = z.object({
  id: text(),
  name: text(),
  email: text(),
  role: RoleSchema,
  companyId: text().nullable(),
  companyName: text().nullable(),
  active: z.boolean(),
  createdAt: text(),
});
export type UserRow = z.infer<typeof UserRowSchema>;

export const UserListQuerySchema = z.object({
  q: text().trim().max(100).optional(),
});

const password = text().min(10, 'Use at least 10 characters.').max(128, 'Use at most 128 characters.');

export const CreateUserSchema = z
  .object({
    name: text().trim().min(1, 'Enter a name.').max(100),
    email: text().trim().max(200).pipe(z.email('Enter a valid e-mail address.')).transform((e) => e.toLowerCase()),
    role: RoleSchema,
    companyId: text().uuid('Choose a company.').nullable().optional(),
    password,
  })
  .refine((u) => u.role !== 'installer' || !!u.companyId, {
    path: ['companyId'],
    message: 'An installer belongs to exactly one customer company: choose it.',
  });
export type CreateUserInput = z.infer<typeof CreateUserSchema>;

export const UpdateUserSchema = z
  .object({
    name: text().trim().min(1).max(100).optional(),
    role: RoleSchema.optional(),
    companyId: text().uuid().nullable().optional(),
    active: z.boolean().optional(),
  })
  .refine((u) => Object.keys(u).length > 0, { message: 'Nothing to change.' });
export type UpdateUserInput = z.infer<typeof UpdateUserSchema>;

export const ResetPasswordSchema = z.object({ password });
export type ResetPasswordInput = z.infer<typeof ResetPasswordSchema>;

export const CompanyOptionSchema = z.object({
  id: text(),
  name: text(),
  kind: z.enum(['wholesaler', 'installer']),
});
export type CompanyOption = z.infer<typeof CompanyOptionSchema>;

/** The user editor's role and company (an installer names their customer company). */
export const UserAccessSchema = z
  .object({
    role: RoleSchema,
    companyId: text().uuid('Choose a company.').nullable(),
  })
  .refine((u) => u.role !== 'installer' || !!u.companyId, {
    path: ['companyId'],
    message: 'An installer belongs to exactly one customer company: choose it.',
  });
export type UserAccessInput = z.infer<typeof UserAccessSchema>;
