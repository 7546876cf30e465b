import { z } from 'zod';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import { CompanyOptionSchema, CreateUserSchema, ResetPasswordSchema, UpdateUserSchema, UserListQuerySchema, UserRowSchema } from '@shared/contracts/users.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentUser } from '../presenters/users.ts';

const one = z.object({ data: UserRowSchema });

export function userRoutes(api: Api, { users }: Pick<AppDeps, 'users'>) {
  api.route({ method: 'get', path: '/admin/users', summary: 'List and search users', tag: 'admin', ability: 'users.manage', query: UserListQuerySchema, response: z.object({ data: z.array(UserRowSchema) }) }, async ({ actor, query }) => ({
    data: (await users.list(actor, query.q)).map(presentUser),
  }));

  api.route({ method: 'post', path: '/admin/users', summary: 'Create a user with a role and company', tag: 'admin', ability: 'users.manage', body: CreateUserSchema, response: one, status: 201 }, async ({ actor, body }) => ({
    data: presentUser(await users.create(actor, body)),
  }));

  api.route({ method: 'patch', path: '/admin/users/:id', summary: 'Change name, role, company or deactivate', tag: 'admin', ability: 'users.manage', params: IdParams, body: UpdateUserSchema, response: one }, async ({ actor, params, body }) => ({
    data: presentUser(await users.update(actor, params.id, body)),
  }));

  api.route({ method: 'post', path: '/admin/users/:id/password', summary: 'Set a new password (ends their sessions)', tag: 'admin', ability: 'users.manage', params: IdParams, body: ResetPasswordSchema, status: 204 }, async ({ actor, params, body, res }) => {
    await users.resetPassword(actor, params.id, body.password);
    res.status(204).end();
  });

  api.route({ method: 'get', path: '/admin/companies', summary: 'Companies a user can belong to', tag: 'admin', ability: 'users.manage', response: z.object({ data: z.array(CompanyOptionSchema) }) }, async ({ actor }) => ({
    data: await users.companies(actor),
  }));
}
