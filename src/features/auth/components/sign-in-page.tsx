import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { signInBodySchema } from '../../../../shared/contracts/auth';
import { meQueryOptions } from '../../../api/session';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/text-field';
import { roleLabel } from '../../../lib/roles';
import { safeNextPath } from '../../../lib/safe-next-path';
import { usePublicConfig } from '../api/get-public-config';
import { useSignIn } from '../api/sign-in';
import { AuthFrame } from './auth-frame';

/** /sign-in: e-mail and password; in demo mode also lists the demo accounts and their password. */
export function SignInPage() {
  const [search] = useSearchParams();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const signIn = useSignIn();
  const config = usePublicConfig();
  const {
    register,
    handleSubmit,
    setValue,
    formState: { errors },
  } = useForm({ resolver: zodResolver(signInBodySchema), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit(async (values) => {
    try {
      await signIn.mutateAsync(values);
    } catch {
      return; // shown from signIn.error
    }
    const user = await queryClient.fetchQuery(meQueryOptions());
    const next = safeNextPath(search.get('next'));
    navigate(next ?? (user?.role === 'printer' ? '/proofs' : '/'), { replace: true });
  });

  const demo = config.data?.demo ? config.data : undefined;
  return (
    <AuthFrame
      title="Sign in"
      aside={
        demo?.demoAccounts && demo.demoAccounts.length > 0 ? (
          <section aria-labelledby="demo-accounts" className="rounded-lg border border-dashed border-rule-strong bg-surface/70 p-4 text-sm">
            <h2 id="demo-accounts" className="font-semibold text-ink">
              Demo accounts
            </h2>
            <p className="mt-1 text-ink-muted">
              This is a demo database. Every account uses the password{' '}
              <code className="rounded bg-paper-deep px-1 text-ink">{demo.demoPassword}</code>.
            </p>
            <ul className="mt-3 flex flex-col gap-1.5">
              {demo.demoAccounts.map((account) => (
                <li key={account.email} className="flex items-center justify-between gap-2">
                  <span>
                    <span className="inline-block w-16 font-medium text-ink">{roleLabel[account.role]}</span>{' '}
                    <code className="text-ink-soft">{account.email}</code>
                  </span>
                  <Button
                    size="sm"
                    variant="ghost"
                    onClick={() => {
                      setValue('email', account.email);
                      setValue('password', demo.demoPassword ?? '');
                    }}
                  >
                    Use<span className="sr-only"> the {roleLabel[account.role]} demo account</span>
                  </Button>
                </li>
              ))}
            </ul>
          </section>
        ) : null
      }
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <ErrorAlert error={signIn.error} title="Sign-in failed" />
        <TextField label="E-mail" type="email" autoComplete="username" {...register('email')} error={errors.email?.message} />
        <TextField label="Password" type="password" autoComplete="current-password" {...register('password')} error={errors.password?.message} />
        <Button type="submit" variant="primary" busy={signIn.isPending}>
          Sign in
        </Button>
        <p className="text-sm">
          <Link to="/forgot-password">Forgot your password?</Link>
        </p>
      </form>
    </AuthFrame>
  );
}
