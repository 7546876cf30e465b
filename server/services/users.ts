import { and, asc, eq, ilike, or } from 'drizzle-orm';
import type { Db } from '../db/client.ts';
import { companies, session, user, account } from '../db/schema/index.ts';
import type { Auth } from '../auth.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import type { CreateUserInput, UpdateUserInput } from '@shared/contracts/users.ts';
import type { Role } from '@shared/roles.ts';

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

/** `onAccessChanged` runs after anything that changes who may do what (sessions remembered elsewhere drop). */
export function createUserService({ db, auth, onAccessChanged = () => {} }: { db: Db; auth: Auth; onAccessChanged?: () => void }) {
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

  /** Installers belong to exactly one customer company; staff belong to the wholesaler. */
  async function checkCompany(role: Role, companyId: string | null | undefined) {
    if (!companyId) {
      if (role === 'installer') throw new ValidationError('An installer must belong to a customer company.', { fields: [{ path: 'companyId', message: 'Choose a company.' }] });
      return null;
    }
    const [company] = await db.select().from(companies).where(eq(companies.id, companyId));
    if (!company) throw new ValidationError('That company does not exist.', { fields: [{ path: 'companyId', message: 'Choose an existing company.' }] });
    const wanted = role === 'installer' ? 'installer' : 'wholesaler';
    if (company.kind !== wanted) {
      const message = role === 'installer' ? 'Installers belong to a customer company.' : 'Staff belong to the wholesaler, not a customer company.';
      throw new ValidationError(message, { fields: [{ path: 'companyId', message }] });
    }
    return company.id;
  }

  return {
    find,

    async list(actor: Actor, q?: string) {
      authorize(actor, 'users.manage');
      const search = q ? or(ilike(user.name, `%${q}%`), ilike(user.email, `%${q}%`), ilike(companies.name, `%${q}%`)) : undefined;
      return db.select(columns).from(user).leftJoin(companies, eq(companies.id, user.companyId)).where(search).orderBy(asc(user.name)).limit(500);
    },

    async create(actor: Actor, input: CreateUserInput) {
      authorize(actor, 'users.manage');
      const companyId = await checkCompany(input.role, input.companyId ?? null) ?? (await wholesalerId());
      const [taken] = await db.select({ id: user.id }).from(user).where(eq(user.email, input.email));
      if (taken) throw new ConflictError('A user with that e-mail already exists.', { fields: [{ path: 'email', message: 'Already in use.' }] });
      const created = await auth.api.createUser({
        body: { email: input.email, password: input.password, name: input.name, role: input.role as never, data: { companyId } },
      });
      return find(created.user.id);
    },

    async update(actor: Actor, id: string, input: UpdateUserInput) {
      authorize(actor, 'users.manage');
      const current = await find(id);
      if (id === actor.userId && (input.active === false || (input.role && input.role !== 'admin'))) {
        throw new ConflictError('You cannot deactivate yourself or remove your own admin role.');
      }
      const role = (input.role ?? current.role ?? 'installer') as Role;
      const companyChanging = input.companyId !== undefined || input.role !== undefined;
      const companyId = companyChanging
        ? (await checkCompany(role, input.companyId === undefined ? current.companyId : input.companyId)) ?? (await wholesalerId())
        : current.companyId;
      await db.transaction(async (tx) => {
        await tx
          .update(user)
          .set({
            name: input.name ?? current.name,
            role,
            companyId,
            banned: input.active === undefined ? current.banned : !input.active,
            updatedAt: new Date(),
          })
          .where(eq(user.id, id));
        // Deactivating or changing what someone may do ends their sessions at once.
        if (input.active === false || (input.role && input.role !== current.role)) await tx.delete(session).where(eq(session.userId, id));
      });
      onAccessChanged();
      return find(id);
    },

    async resetPassword(actor: Actor, id: string, password: string) {
      authorize(actor, 'users.manage');
      await find(id);
      const ctx = await auth.$context;
      const hash = await ctx.password.hash(password);
      await db.transaction(async (tx) => {
        const updated = await tx
          .update(account)
          .set({ password: hash, updatedAt: new Date() })
          .where(and(eq(account.userId, id), eq(account.providerId, 'credential')))
          .returning({ id: account.id });
        if (updated.length === 0) throw new NotFoundError('That user’s password sign-in');
        await tx.delete(session).where(eq(session.userId, id));
      });
      onAccessChanged();
    },

    async companies(actor: Actor) {
      authorize(actor, 'users.manage');
      return db.select({ id: companies.id, name: companies.name, kind: companies.kind }).from(companies).orderBy(asc(companies.name));
    },
  };

  async function wholesalerId() {
    const [w] = await db.select({ id: companies.id }).from(companies).where(eq(companies.kind, 'wholesaler')).limit(1);
    return w?.id ?? null;
  }
}

export type UserService = ReturnType<typeof createUserService>;
