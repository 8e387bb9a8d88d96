import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { createInvitationBodySchema } from '../../../../shared/contracts/auth';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Dialog } from '../../../components/dialog';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { roleLabel, roles } from '../../../lib/roles';
import { useInviteUser } from '../api/invite-user';

const roleOptions = roles.map((r) => ({ value: r, label: roleLabel[r] }));

/** Invite someone by e-mail with a role; they get a one-time sign-up link. */
export function InviteDialog({ open, onClose, onInvited }: { open: boolean; onClose: () => void; onInvited: (email: string) => void }) {
  const invite = useInviteUser();
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm({ resolver: zodResolver(createInvitationBodySchema), defaultValues: { email: '', role: 'setter' as const } });
  const close = () => {
    reset();
    invite.reset();
    onClose();
  };
  const onSubmit = handleSubmit((values) =>
    invite.mutate(values, {
      onSuccess: (invitation) => {
        onInvited(invitation.email);
        close();
      },
    }),
  );
  return (
    <Dialog open={open} onClose={close} title="Invite someone">
      <form id="invite-form" onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <ErrorAlert error={invite.error} title="Could not send the invitation" />
        <TextField label="E-mail" type="email" {...register('email')} error={errors.email?.message} />
        <SelectField label="Role" options={roleOptions} {...register('role')} error={errors.role?.message} />
        <p className="text-sm text-ink-muted">They get a mail with a one-time link to choose a name and password.</p>
        <div className="flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" busy={invite.isPending}>
            Send the invitation
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
