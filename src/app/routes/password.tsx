import { useEffect, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useSearchParams } from 'react-router';
import { TextField } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Logo } from '@/components/brand/logo.tsx';
import { paths } from '@/config/paths.ts';
import { useRequestPasswordReset, useResetPassword } from '@/features/auth/api/reset-password.ts';

function Frame({ title, children }: { title: string; children: ReactNode }) {
  useEffect(() => {
    document.title = `${title} · Stackyard`;
  }, [title]);
  return (
    <div className="flex min-h-screen items-center justify-center p-6">
      <main className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-3">
          <Logo className="h-10 w-10" />
          <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
        </div>
        <div className="space-y-4 rounded-lg border border-line bg-card p-5">{children}</div>
        <p className="mt-4 text-sm">
          <Link to={paths.signIn.href()} className="text-copper underline">
            Back to sign-in
          </Link>
        </p>
      </main>
    </div>
  );
}

/** "Forgot my password": a reset link goes to the address if it has an account. */
export function ForgotPasswordRoute() {
  const ask = useRequestPasswordReset();
  const { register, handleSubmit, formState } = useForm<{ email: string }>();
  const onSubmit = handleSubmit((v) => ask.mutate(v));
  return (
    <Frame title="Forgotten password">
      {ask.isSuccess ? (
        <Notice tone="good">If that address has a Stackyard account, a link to choose a new password is on its way. It works for 24 hours.</Notice>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          <p className="text-sm text-ink-soft">Give the e-mail address you sign in with; we send a link to choose a new password.</p>
          <TextField label="E-mail" type="email" autoComplete="username" error={formState.errors.email?.message} {...register('email', { required: 'Enter your e-mail address.' })} />
          {ask.error && <Notice tone="danger">{ask.error.message}</Notice>}
          <Button type="submit" variant="primary" className="w-full" disabled={ask.isPending}>
            {ask.isPending ? 'Sending…' : 'Send the link'}
          </Button>
        </form>
      )}
    </Frame>
  );
}

/** Where invitation and reset links land: choose a password with the link's token. */
export function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const reset = useResetPassword();
  const { register, handleSubmit, formState, getValues } = useForm<{ password: string; again: string }>();
  const onSubmit = handleSubmit((v) => token && reset.mutate({ token, newPassword: v.password }));
  if (!token || params.get('error'))
    return (
      <Frame title="Choose a password">
        <Notice tone="danger">This link has expired or been used already.</Notice>
        <Link to={paths.forgotPassword.href()} className="text-sm text-copper underline">
          Ask for a new link
        </Link>
      </Frame>
    );
  return (
    <Frame title="Choose a password">
      {reset.isSuccess ? (
        <Notice tone="good" title="Password set">
          Sign in with it now.
        </Notice>
      ) : (
        <form onSubmit={onSubmit} noValidate className="space-y-4">
          <TextField
            label="New password"
            type="password"
            autoComplete="new-password"
            hint="At least 10 characters."
            error={formState.errors.password?.message}
            {...register('password', { required: 'Choose a password.', minLength: { value: 10, message: 'Use at least 10 characters.' }, maxLength: { value: 128, message: 'Use at most 128 characters.' } })}
          />
          <TextField label="The same again" type="password" autoComplete="new-password" error={formState.errors.again?.message} {...register('again', { validate: (v) => v === getValues('password') || 'The two passwords differ.' })} />
          {reset.error && <Notice tone="danger">{reset.error.message}</Notice>}
          <Button type="submit" variant="primary" className="w-full" disabled={reset.isPending}>
            {reset.isPending ? 'Saving…' : 'Set my password'}
          </Button>
        </form>
      )}
    </Frame>
  );
}
