import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { z } from 'zod';
import { acceptInvitationBodySchema } from '../../../../shared/contracts/auth';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Loading } from '../../../components/page';
import { TextField } from '../../../components/text-field';
import { errorMessage } from '../../../lib/api-client';
import { roleLabel } from '../../../lib/roles';
import { useAcceptInvitation } from '../api/accept-invitation';
import { useInvitation } from '../api/get-invitation';
import { AuthFrame } from './auth-frame';

const formSchema = acceptInvitationBodySchema
  .extend({ confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'does not match the password' });

/** /invite/:token: the invitee sets a name and a password and is signed in. */
export function AcceptInvitationPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation(token);
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm({ resolver: zodResolver(formSchema), defaultValues: { name: '', password: '', confirm: '' } });
  const onSubmit = handleSubmit((values) =>
    accept.mutate(
      { name: values.name, password: values.password },
      { onSuccess: (user) => navigate(user.role === 'printer' ? '/proofs' : '/', { replace: true }) },
    ),
  );

  if (invitation.isPending) {
    return (
      <AuthFrame title="Accept your invitation">
        <Loading label="Checking the invitation…" />
      </AuthFrame>
    );
  }
  if (invitation.error || !invitation.data.valid) {
    const why =
      invitation.data?.reason === 'used'
        ? 'This invitation has already been used. If it was you, sign in.'
        : invitation.data?.reason === 'expired'
          ? 'This invitation has expired. Ask an admin to send a new one.'
          : errorMessage(invitation.error);
    return (
      <AuthFrame title="Accept your invitation">
        <div className="flex flex-col gap-4">
          <Alert tone="danger" title="This invitation cannot be used">
            {why}
          </Alert>
          <Link to="/sign-in">Go to sign in</Link>
        </div>
      </AuthFrame>
    );
  }
  return (
    <AuthFrame title="Accept your invitation">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <p className="text-sm text-ink-muted">
          You are invited as <strong className="text-ink">{roleLabel[invitation.data.role]}</strong> with the address{' '}
          <code className="text-ink">{invitation.data.email}</code>. Choose your name and a password.
        </p>
        <ErrorAlert error={accept.error} title="Could not finish the sign-up" />
        <TextField label="Your name" autoComplete="name" {...register('name')} error={errors.name?.message} />
        <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." {...register('password')} error={errors.password?.message} />
        <TextField label="Password, again" type="password" autoComplete="new-password" {...register('confirm')} error={errors.confirm?.message} />
        <Button type="submit" variant="primary" busy={accept.isPending}>
          Create my account
        </Button>
      </form>
    </AuthFrame>
  );
}
