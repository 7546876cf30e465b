import { useMutation, useQueryClient } from '@tanstack/react-query';
import { authClient } from '@/lib/auth-client.ts';
import { authKeys } from './get-me.ts';

export interface SignInInput {
  email: string;
  password: string;
}

/** Plain-language messages for what the auth routes answer (our error envelope, its code lower-cased). */
function explain(status: number, code?: string) {
  if (status === 429) return 'Too many sign-in attempts. Wait a minute and try again.';
  if (code === 'banned_user' || status === 403) return 'This account is deactivated. Ask your administrator to reactivate it.';
  if (status === 401 || code === 'invalid_email_or_password') return 'That e-mail and password do not match. Check both and try again.';
  return 'Sign-in failed. Try again in a moment.';
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ email, password }: SignInInput) => {
      const { error } = await authClient.signIn.email({ email, password });
      if (error) throw new Error(explain(error.status, (error as { error?: { code?: string } }).error?.code));
    },
    onSuccess: () => qc.invalidateQueries({ queryKey: authKeys.me }),
  });
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async ({ everywhere }: { everywhere?: boolean } = {}) => {
      if (everywhere) await authClient.revokeSessions();
      await authClient.signOut();
    },
    onSettled: () => {
      qc.clear();
      qc.setQueryData(authKeys.me, null);
    },
  });
}
