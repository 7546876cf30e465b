import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router';
import { paths } from '@/config/paths.ts';
import { useSignIn } from '@/features/auth/api/sign-in.ts';
import { TextField } from '@/components/ui/field.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Notice } from '@/components/ui/notice.tsx';
import { Logo } from '@/components/brand/logo.tsx';

interface Form {
  email: string;
  password: string;
}

/** Only same-site paths are followed after sign-in. */
function safeRedirect(target: string | null) {
  return target && target.startsWith('/') && !target.startsWith('//') ? target : '/';
}

export function SignInRoute() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const { register, handleSubmit, formState } = useForm<Form>();
  useEffect(() => {
    document.title = 'Sign in · Stackyard';
  }, []);

  const onSubmit = handleSubmit((values) =>
    signIn.mutate(values, { onSuccess: () => navigate(safeRedirect(params.get('redirectTo')), { replace: true }) }),
  );

  return (
    <div className="flex min-h-screen items-center justify-center p-6">
      <main className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-3">
          <Logo className="h-10 w-10" />
          <div>
            <h1 className="text-2xl font-semibold tracking-tight">Stackyard</h1>
            <p className="text-sm text-ink-soft">Parts, kits and stock for battery installs</p>
          </div>
        </div>
        <form onSubmit={onSubmit} noValidate className="space-y-4 rounded-lg border border-line bg-card p-5">
          <TextField
            label="E-mail"
            type="email"
            autoComplete="username"
            autoFocus
            error={formState.errors.email?.message}
            {...register('email', { required: 'Enter your e-mail address.' })}
          />
          <TextField
            label="Password"
            type="password"
            autoComplete="current-password"
            error={formState.errors.password?.message}
            {...register('password', { required: 'Enter your password.' })}
          />
          {signIn.error && <Notice tone="danger">{signIn.error.message}</Notice>}
          <Button type="submit" variant="primary" className="w-full" disabled={signIn.isPending}>
            {signIn.isPending ? 'Signing in…' : 'Sign in'}
          </Button>
          <p className="text-xs text-ink-soft">
            Accounts are created by your administrator.{' '}
            <Link to={paths.forgotPassword.href()} className="text-copper underline">
              Forgotten your password?
            </Link>
          </p>
        </form>
      </main>
    </div>
  );
}
