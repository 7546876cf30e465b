import { AsyncLocalStorage } from 'node:async_hooks';

/**
 * Set around a password-reset request made for a new user: the auth library's reset hook then
 * sends an invitation (who added them, to which company) instead of a "forgot password" message.
 */
export const invitationContext = new AsyncLocalStorage<{ inviterName: string; companyName: string }>();

/** How long an invitation or reset link works. */
export const RESET_LINK_SECONDS = 24 * 60 * 60;

/** The client page a reset or invitation link lands on (it reads ?token=). */
export const RESET_PAGE_PATH = '/reset-password';
