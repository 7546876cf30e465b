import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin } from 'better-auth/plugins';
import { createAccessControl } from 'better-auth/plugins/access';
import { adminAc, defaultStatements } from 'better-auth/plugins/admin/access';
import type { Logger } from 'pino';
import type { Db } from './db/client.ts';
import * as schema from './db/schema/index.ts';
import { enqueueMail } from './services/mail.ts';
import { invitationContext, RESET_LINK_SECONDS } from './mail/invitations.ts';

/** The header our own middleware sets from the socket address, so rate limits key on the real client. */
export const CLIENT_IP_HEADER = 'x-stackyard-client-ip';

const ac = createAccessControl(defaultStatements);
const noAdminPowers = ac.newRole({ user: [], session: [] });
const roles = {
  admin: ac.newRole({ ...adminAc.statements }),
  purchasing: noAdminPowers,
  warehouse: noAdminPowers,
  sales: noAdminPowers,
  installer: noAdminPowers,
};

const adminPlugin = admin({ ac, roles, defaultRole: 'installer', adminRoles: ['admin'] });
/**
 * The admin plugin's HTTP routes stay closed: its API is called in-process by the users service,
 * which adds the company rules. (app.ts refuses /api/auth/admin/* first; this covers any path
 * spelling that reaches the library's router.)
 */
const ADMIN_PATHS = Object.values(adminPlugin.endpoints).map((e) => e.path);

export interface AuthOptions {
  db: Db;
  baseURL: string;
  secret: string;
  trustedOrigins: string[];
  signInLimitPerMinute: number;
  /** The library's own log lines go here (redacted like ours); without one it prints to the console. */
  logger?: Logger;
}

export function createAuth({ db, baseURL, secret, trustedOrigins, signInLimitPerMinute, logger }: AuthOptions) {
  return betterAuth({
    logger: logger && {
      log: (level, message, ...args) => {
        // Errors go through the logger's error serializer, which masks a failed query's values.
        const err = args.find((a) => a instanceof Error);
        logger[level]({ from: 'auth', ...(err ? { err } : {}) }, message);
      },
    },
    appName: 'Stackyard',
    baseURL,
    basePath: '/api/auth',
    secret,
    trustedOrigins,
    database: drizzleAdapter(db, {
      provider: 'pg',
      schema: {
        user: schema.user,
        session: schema.session,
        account: schema.account,
        verification: schema.verification,
        rateLimit: schema.rateLimit,
        userRelations: schema.userRelations,
        sessionRelations: schema.sessionRelations,
        accountRelations: schema.accountRelations,
      },
    }),
    emailAndPassword: {
      enabled: true,
      disableSignUp: true,
      minPasswordLength: 10,
      maxPasswordLength: 128,
      resetPasswordTokenExpiresIn: RESET_LINK_SECONDS,
      revokeSessionsOnPasswordReset: true,
      // The library makes the link; the outbox sends it (an invitation when a user was just added for someone).
      sendResetPassword: async ({ user: u, url }) => {
        const invite = invitationContext.getStore();
        if (invite) await enqueueMail(db, { event: 'invitation', to: u.email, data: { name: u.name, inviterName: invite.inviterName, companyName: invite.companyName, url }, refs: { userId: u.id } });
        else await enqueueMail(db, { event: 'password-reset', to: u.email, data: { name: u.name, url }, refs: { userId: u.id } });
      },
    },
    user: { additionalFields: { companyId: { type: 'string', required: false, input: false } } },
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24 },
    rateLimit: {
      enabled: true,
      storage: 'database',
      window: 60,
      max: 600,
      customRules: { '/sign-in/email': { window: 60, max: signInLimitPerMinute } },
    },
    advanced: {
      useSecureCookies: baseURL.startsWith('https://'),
      ipAddress: { ipAddressHeaders: [CLIENT_IP_HEADER] },
      // One query (session joined to user) per signed-in request instead of two.
      database: { joins: true },
    },
    experimental: { instrumentation: { enabled: false } },
    telemetry: { enabled: false },
    disabledPaths: ADMIN_PATHS,
    plugins: [adminPlugin],
  });
}

export type Auth = ReturnType<typeof createAuth>;
