import { asc, eq, ilike, or } from 'drizzle-orm';
import type { Db } from '../db/client.ts';
import { companies, user } from '../db/schema/index.ts';
import type { Auth } from '../auth.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { assertCompanyFitsRole } from '../policies/company-scope.ts';
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../errors.ts';
import type { CreateUserInput, UpdateUserInput } from '@shared/contracts/users.ts';
import { companyKindOf, type Role } from '@shared/roles.ts';
import { invitationContext, RESET_PAGE_PATH } from '../mail/invitations.ts';

export interface UserRecord {
  id: string;
  name: string;
  email: string;
  role: string | null;
  banned: boolean | null;
  companyId: string | null;
  companyName: string | null;
  createdAt: Date;
}

/**
 * Users through the auth library's admin API (create, update, ban, password, sessions), so the
 * library hashes passwords and revokes sessions its own way; this service adds the company rule
 * and reads. It never writes the library's tables itself. The library's own admin routes are
 * closed (app.ts): these are the only way in.
 *
 * `onAccessChanged` runs after anything that changes who may do what (sessions remembered elsewhere drop).
 */
export function createUserService({ db, auth, appUrl, onAccessChanged = () => {} }: { db: Db; auth: Auth; appUrl: string; onAccessChanged?: () => void }) {
  const columns = {
    id: user.id,
    name: user.name,
    email: user.email,
    role: user.role,
    banned: user.banned,
    companyId: user.companyId,
    companyName: companies.name,
    createdAt: user.createdAt,
  };

  async function find(id: string): Promise<UserRecord> {
    const [row] = await db.select(columns).from(user).leftJoin(companies, eq(companies.id, user.companyId)).where(eq(user.id, id));
    if (!row) throw new NotFoundError('That user');
    return row;
  }

  /** The company a user of this role belongs to: the one named if it fits, the wholesaler for staff who name none. */
  async function companyFor(role: Role, companyId: string | null | undefined) {
    const [company] = companyId
      ? await db.select({ id: companies.id, kind: companies.kind }).from(companies).where(eq(companies.id, companyId))
      : companyKindOf(role) === 'wholesaler'
        ? await db.select({ id: companies.id, kind: companies.kind }).from(companies).where(eq(companies.kind, 'wholesaler')).limit(1)
        : [];
    if (companyId && !company) throw new ValidationError('That company does not exist.', { fields: [{ path: 'companyId', message: 'Choose an existing company.' }] });
    assertCompanyFitsRole(role, company ?? null);
    return company?.id ?? null;
  }

  /** The signed-in admin's own session, which the library's admin API checks. */
  function as(actor: Actor) {
    if (!actor.credentials) throw new ForbiddenError();
    return actor.credentials;
  }

  /** Sends the new user an invitation: a link to choose their own password (the library's reset token). */
  async function invite(actor: Actor, u: UserRecord) {
    await invitationContext.run({ inviterName: actor.name, companyName: u.companyName ?? 'Stackyard' }, () =>
      auth.api.requestPasswordReset({ body: { email: u.email, redirectTo: `${appUrl}${RESET_PAGE_PATH}` } }),
    );
  }

  return {
    find,
    invite,

    async list(actor: Actor, q?: string) {
      authorize(actor, 'users.manage');
      const search = q ? or(ilike(user.name, `%${q}%`), ilike(user.email, `%${q}%`), ilike(companies.name, `%${q}%`)) : undefined;
      return db.select(columns).from(user).leftJoin(companies, eq(companies.id, user.companyId)).where(search).orderBy(asc(user.name)).limit(500);
    },

    async create(actor: Actor, input: CreateUserInput) {
      authorize(actor, 'users.manage');
      const companyId = await companyFor(input.role, input.companyId);
      const [taken] = await db.select({ id: user.id }).from(user).where(eq(user.email, input.email));
      if (taken) throw new ConflictError('A user with that e-mail already exists.', { fields: [{ path: 'email', message: 'Already in use.' }] });
      const created = await auth.api.createUser({
        headers: as(actor),
        body: { email: input.email, password: input.password, name: input.name, role: input.role as never, data: { companyId } },
      });
      const made = await find(created.user.id);
      await invite(actor, made);
      return made;
    },

    async update(actor: Actor, id: string, input: UpdateUserInput) {
      authorize(actor, 'users.manage');
      const current = await find(id);
      if (id === actor.userId && (input.active === false || (input.role && input.role !== 'admin'))) {
        throw new ConflictError('You cannot deactivate yourself or remove your own admin role.');
      }
      const role = (input.role ?? current.role ?? 'installer') as Role;
      const companyChanging = input.companyId !== undefined || input.role !== undefined;
      // Staff always belong to the wholesaler, so a move to a staff role need not name it.
      const requested = input.companyId !== undefined ? input.companyId : companyKindOf(role) === 'wholesaler' ? null : current.companyId;
      const companyId = companyChanging ? await companyFor(role, requested) : current.companyId;
      const headers = as(actor);
      // Deactivate first, so a failure further on never leaves someone signed in with new powers.
      if (input.active === false && !current.banned) await auth.api.banUser({ headers, body: { userId: id, banReason: 'Deactivated in Stackyard' } });
      // Name, role and company in one row update, so the database's company rule sees them together.
      await auth.api.adminUpdateUser({ headers, body: { userId: id, data: { name: input.name ?? current.name, role, companyId } } });
      // Changing what someone may do ends their sessions at once (banning already has).
      if (input.role && input.role !== current.role) await auth.api.revokeUserSessions({ headers, body: { userId: id } });
      if (input.active === true && current.banned) await auth.api.unbanUser({ headers, body: { userId: id } });
      onAccessChanged();
      return find(id);
    },

    async resetPassword(actor: Actor, id: string, password: string) {
      authorize(actor, 'users.manage');
      await find(id);
      const headers = as(actor);
      await auth.api.setUserPassword({ headers, body: { userId: id, newPassword: password } });
      await auth.api.revokeUserSessions({ headers, body: { userId: id } });
      onAccessChanged();
    },

    async companies(actor: Actor) {
      authorize(actor, 'users.manage');
      return db.select({ id: companies.id, name: companies.name, kind: companies.kind }).from(companies).orderBy(asc(companies.name));
    },
  };
}

export type UserService = ReturnType<typeof createUserService>;
