import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link, useSearchParams } from 'react-router-dom';
import { z } from 'zod';
import { passwordSchema } from '../../../../shared/contracts/auth';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/text-field';
import { useResetPassword } from '../api/reset-password';
import { AuthFrame } from './auth-frame';

const formSchema = z
  .object({ newPassword: passwordSchema, confirm: z.string() })
  .refine((v) => v.newPassword === v.confirm, { path: ['confirm'], message: 'does not match the new password' });

/** /reset-password?token=...: the page the reset mail links to. */
export function ResetPasswordPage() {
  const [search] = useSearchParams();
  const token = search.get('token');
  const linkError = search.get('error');
  const reset = useResetPassword();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm({ resolver: zodResolver(formSchema), defaultValues: { newPassword: '', confirm: '' } });
  const onSubmit = handleSubmit((values) => {
    if (token) reset.mutate({ token, newPassword: values.newPassword });
  });
  if (!token || linkError) {
    return (
      <AuthFrame title="Set a new password">
        <div className="flex flex-col gap-4">
          <Alert tone="danger" title="This link cannot be used">
            The reset link is incomplete, expired or already used. Ask for a new one.
          </Alert>
          <Link to="/forgot-password">Ask for a new link</Link>
        </div>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title="Set a new password">
      {reset.isSuccess ? (
        <div className="flex flex-col gap-4">
          <Alert tone="success" title="Password changed">
            Your new password is set. Sign in with it now.
          </Alert>
          <Link to="/sign-in">Sign in</Link>
        </div>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          <ErrorAlert error={reset.error} title="Could not set the password" />
          <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." {...register('newPassword')} error={errors.newPassword?.message} />
          <TextField label="New password, again" type="password" autoComplete="new-password" {...register('confirm')} error={errors.confirm?.message} />
          <Button type="submit" variant="primary" busy={reset.isPending}>
            Set the password
          </Button>
        </form>
      )}
    </AuthFrame>
  );
}
