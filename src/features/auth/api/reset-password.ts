import { useMutation } from '@tanstack/react-query';
import { authClient } from '@/lib/auth-client.ts';

/** Asks for a reset link by e-mail. The answer is the same whether or not the address is known. */
export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: async ({ email }: { email: string }) => {
      const { error } = await authClient.requestPasswordReset({ email, redirectTo: `${window.location.origin}/reset-password` });
      if (error) throw new Error(error.status === 429 ? 'Too many requests. Wait a minute and try again.' : 'The reset link could not be sent. Try again in a moment.');
    },
  });
}

/** Sets a new password with the token from an invitation or reset link. */
export function useResetPassword() {
  return useMutation({
    mutationFn: async ({ token, newPassword }: { token: string; newPassword: string }) => {
      const { error } = await authClient.resetPassword({ token, newPassword });
      if (error) throw new Error(/token/i.test(error.message ?? '') || error.status === 400 ? 'This link has expired or been used already. Ask for a new one.' : 'The password could not be set. Try again in a moment.');
    },
  });
}
