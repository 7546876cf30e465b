import { createAuthClient } from 'better-auth/client';

/** better-auth's browser client, same origin, for sign-in and sign-out only. */
export const authClient = createAuthClient({ basePath: '/api/auth' });
