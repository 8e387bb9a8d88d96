import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { emailSchema } from '../../../../shared/contracts/auth';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TextField } from '../../../components/text-field';
import { useRequestPasswordReset } from '../api/request-password-reset';
import { AuthFrame } from './auth-frame';

const formSchema = z.object({ email: emailSchema });

/** /forgot-password: asks for a reset link by mail. */
export function ForgotPasswordPage() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm({ resolver: zodResolver(formSchema), defaultValues: { email: '' } });
  const onSubmit = handleSubmit((values) => request.mutate(values.email));
  return (
    <AuthFrame title="Reset your password">
      {request.isSuccess ? (
        <div className="flex flex-col gap-4">
          <Alert tone="success" title="Check your mail">
            If an account uses that address, a link to set a new password is on its way. The link works once and for a
            limited time.
          </Alert>
          <Link to="/sign-in">Back to sign in</Link>
        </div>
      ) : (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          <p className="text-sm text-ink-muted">Enter the address you sign in with. We will mail you a link to set a new password.</p>
          <ErrorAlert error={request.error} title="Could not send the link" />
          <TextField label="E-mail" type="email" autoComplete="email" {...register('email')} error={errors.email?.message} />
          <Button type="submit" variant="primary" busy={request.isPending}>
            Send the link
          </Button>
          <Link to="/sign-in" className="text-sm">
            Back to sign in
          </Link>
        </form>
      )}
    </AuthFrame>
  );
}
