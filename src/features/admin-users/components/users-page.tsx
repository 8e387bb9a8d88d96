import { useState } from 'react';
import { roleSchema } from '../../../../shared/contracts/common';
import type { AdminUser, PendingInvitation } from '../../../../shared/contracts/users';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Card } from '../../../components/page';
import { PlainTable } from '../../../components/plain-table';
import { useMe } from '../../../api/session';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Loading, Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { formatDate } from '../../../lib/format';
import { roleLabel, roles, type Role } from '../../../lib/roles';
import { useUsers } from '../api/list-users';
import { useUpdateUser } from '../api/update-user';
import { useInvitations, useResendInvitation, useRevokeInvitation } from '../api/invitations';
import { InviteDialog } from './invite-dialog';

/** /admin/users: everyone with an account; invite, change role, deactivate or reactivate. */
export function UsersPage() {
  const users = useUsers();
  const me = useMe();
  const update = useUpdateUser();
  const [inviting, setInviting] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const [pending, setPending] = useState<{ user: AdminUser; change: { role?: Role; active?: boolean } } | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const confirm = () => {
    if (!pending) return;
    const { user, change } = pending;
    update.mutate(
      { id: user.id, ...change },
      {
        onSuccess: () => {
          setDone(change.role ? `${user.name} is now ${article(change.role)} ${roleLabel[change.role].toLowerCase()}.` : `${user.name} is ${change.active ? 'active again' : 'deactivated'}.`);
          setPending(null);
        },
      },
    );
  };
  return (
    <Page
      title="Users"
      description="Everyone who can sign in to this desk, with their role. Deactivated accounts cannot sign in; nothing they did is deleted."
      actions={
        <Button variant="primary" onClick={() => setInviting(true)}>
          Invite someone
        </Button>
      }
    >
      {notice ? (
        <Alert tone="success" title="Invitation sent">
          {notice}
        </Alert>
      ) : null}
      {done ? (
        <Alert tone="success" title="Saved">
          {done}
        </Alert>
      ) : null}
      {users.isPending ? (
        <Loading />
      ) : users.error ? (
        <ErrorAlert error={users.error} title="Could not load the users" />
      ) : users.data.length === 0 ? (
        <EmptyState title="No users yet" />
      ) : (
        <FramedTable caption="Users" headings={['Name', 'E-mail', 'Role', 'State', 'Since', '']} ruledHead>
          {users.data.map((user) => (
            <UserRow key={user.id} user={user} isSelf={me.data?.id === user.id} busy={update.isPending && update.variables?.id === user.id} onChange={(change) => { update.reset(); setDone(null); setPending({ user, change }); }} />
          ))}
        </FramedTable>
      )}
      <Invitations />
      <ConfirmDialog
        open={pending !== null}
        title={pending ? confirmTitle(pending.user, pending.change) : ''}
        confirmLabel={pending?.change.role ? `Make ${pending.user.name} ${article(pending.change.role)} ${roleLabel[pending.change.role].toLowerCase()}` : pending?.change.active === false ? `Deactivate ${pending.user.name}` : `Reactivate ${pending?.user.name ?? ''}`}
        confirmVariant={pending?.change.active === false || pending?.change.role === 'admin' ? 'danger' : 'primary'}
        busy={update.isPending}
        error={update.error}
        onCancel={() => {
          update.reset();
          setPending(null);
        }}
        onConfirm={confirm}
      >
        {pending ? <p>{confirmText(pending.user, pending.change)}</p> : null}
      </ConfirmDialog>
      <InviteDialog
        open={inviting}
        onClose={() => setInviting(false)}
        onInvited={(email) => setNotice(`A sign-up link is on its way to ${email}. In local mode you can read it in Mailbox (local).`)}
      />
    </Page>
  );
}

function UserRow({ user, isSelf, busy, onChange }: { user: AdminUser; isSelf: boolean; busy: boolean; onChange: (change: { role?: Role; active?: boolean }) => void }) {
  return (
    <tr className="border-b border-rule last:border-b-0">
      <td className="px-3 py-2 font-medium">
        {user.name}
        {isSelf ? <span className="ml-2 text-xs font-normal text-ink-muted">(you)</span> : null}
      </td>
      <td className="px-3 py-2">
        <code className="text-ink-soft">{user.email}</code>
      </td>
      <td className="px-3 py-2">
        <select
          aria-label={`Role of ${user.email}`}
          value={user.role}
          disabled={busy || isSelf}
          title={isSelf ? 'Another admin must change your own role' : undefined}
          onChange={(e) => onChange({ role: roleSchema.parse(e.target.value) })}
          className="h-8 rounded-md border border-rule-strong bg-surface px-2 focus-visible:outline-2 focus-visible:outline-focus"
        >
          {roles.map((r) => (
            <option key={r} value={r}>
              {roleLabel[r]}
            </option>
          ))}
        </select>
      </td>
      <td className="px-3 py-2">{user.active ? <StatusBadge tone="success">Active</StatusBadge> : <StatusBadge tone="neutral">Deactivated</StatusBadge>}</td>
      <td className="px-3 py-2 tabular-nums text-ink-muted">{formatDate(user.createdAt)}</td>
      <td className="px-3 py-2 text-right">
        {isSelf ? null : (
        <Button size="sm" variant={user.active ? 'danger' : 'secondary'} busy={busy} onClick={() => onChange({ active: !user.active })} aria-label={`${user.active ? 'Deactivate' : 'Reactivate'} ${user.email}`}>
          {user.active ? 'Deactivate' : 'Reactivate'}
        </Button>
        )}
      </td>
    </tr>
  );
}

const article = (r: Role) => (r === 'admin' || r === 'editor' ? 'an' : 'a');

/** What each role may do (product.md), for the confirmation of a role change. */
const roleMeans: Record<Role, string> = {
  setter: 'submit tilings and follow their own submissions and earnings; nothing else',
  editor: 'review submissions, curate the stock, make puzzles, compose and publish editions and run payouts',
  printer: 'see editions sent to proof, download proofs and press files, approve or return proofs',
  admin: 'do everything an editor can, and manage users, invitations, roles, publications and templates',
};

function confirmTitle(user: AdminUser, change: { role?: Role; active?: boolean }): string {
  if (change.role) return `Change the role of ${user.name}?`;
  return change.active ? `Reactivate ${user.name}?` : `Deactivate ${user.name}?`;
}

function confirmText(user: AdminUser, change: { role?: Role; active?: boolean }): string {
  if (change.role) return `${user.name} (${user.email}) is ${article(user.role)} ${roleLabel[user.role].toLowerCase()} now. As ${article(change.role)} ${roleLabel[change.role].toLowerCase()} they may ${roleMeans[change.role]}. It takes effect on their next request.`;
  if (change.active) return `${user.name} (${user.email}) can sign in again, as ${article(user.role)} ${roleLabel[user.role].toLowerCase()}.`;
  return `${user.name} (${user.email}) is signed out everywhere at once and cannot sign in until reactivated. Nothing they did is deleted.`;
}

/** Invitations not yet accepted: resend (a new link for another week) or revoke (the link stops working). */
function Invitations() {
  const list = useInvitations();
  const resend = useResendInvitation();
  const revoke = useRevokeInvitation();
  const [revoking, setRevoking] = useState<PendingInvitation | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  return (
    <Card title="Pending invitations">
      {notice ? <Alert tone="success">{notice}</Alert> : null}
      <ErrorAlert error={resend.error} title="Could not resend" />
      {list.isPending ? (
        <Loading />
      ) : list.error ? (
        <ErrorAlert error={list.error} title="Could not load the invitations" />
      ) : list.data.length === 0 ? (
        <p className="text-sm text-ink-muted">No invitation is waiting to be accepted.</p>
      ) : (
        <PlainTable caption="Pending invitations" headings={['E-mail', 'Role', 'Invited', 'Link', '']}>
          {list.data.map((i) => (
            <tr key={i.id} className="border-t border-rule">
              <td className="px-3 py-2">
                <code className="text-ink-soft">{i.email}</code>
              </td>
              <td className="px-3 py-2">{roleLabel[i.role]}</td>
              <td className="px-3 py-2 tabular-nums">{`${formatDate(i.createdAt)}${i.invitedByName ? ` by ${i.invitedByName}` : ''}`}</td>
              <td className="px-3 py-2">{i.expired ? <StatusBadge tone="warning">Expired</StatusBadge> : `Works until ${formatDate(i.expiresAt)}`}</td>
              <td className="px-3 py-2 text-right">
                <span className="inline-flex gap-2">
                  <Button
                    size="sm"
                    busy={resend.isPending && resend.variables === i.id}
                    aria-label={`Resend the invitation to ${i.email}`}
                    onClick={() => resend.mutate(i.id, { onSuccess: (r) => setNotice(`A new link is on its way to ${r.email}; it works until ${formatDate(r.expiresAt)}. The old link no longer works.`) })}
                  >
                    Resend
                  </Button>
                  <Button size="sm" variant="danger" aria-label={`Revoke the invitation to ${i.email}`} onClick={() => setRevoking(i)}>
                    Revoke
                  </Button>
                </span>
              </td>
            </tr>
          ))}
        </PlainTable>
      )}
      <ConfirmDialog
        open={revoking !== null}
        title={`Revoke the invitation to ${revoking?.email ?? ''}?`}
        confirmLabel="Revoke the invitation"
        confirmVariant="danger"
        busy={revoke.isPending}
        error={revoke.error}
        onCancel={() => {
          revoke.reset();
          setRevoking(null);
        }}
        onConfirm={() =>
          revoking &&
          revoke.mutate(revoking.id, {
            onSuccess: () => {
              setNotice(`The invitation to ${revoking.email} is revoked; its link no longer works.`);
              setRevoking(null);
            },
          })
        }
      >
        <p>The link in the mail stops working at once. You can invite the address again later.</p>
      </ConfirmDialog>
    </Card>
  );
}
