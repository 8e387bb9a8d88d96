import { useState } from 'react';
import { roleSchema } from '../../../../shared/contracts/common';
import type { AdminUser } from '../../../../shared/contracts/users';
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
import { InviteDialog } from './invite-dialog';

/** /admin/users: everyone with an account; invite, change role, deactivate or reactivate. */
export function UsersPage() {
  const users = useUsers();
  const me = useMe();
  const update = useUpdateUser();
  const [inviting, setInviting] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
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
      <ErrorAlert error={update.error} title="The change was not saved" />
      {users.isPending ? (
        <Loading />
      ) : users.error ? (
        <ErrorAlert error={users.error} title="Could not load the users" />
      ) : users.data.length === 0 ? (
        <EmptyState title="No users yet" />
      ) : (
        <FramedTable caption="Users" headings={['Name', 'E-mail', 'Role', 'State', 'Since', '']} ruledHead>
          {users.data.map((user) => (
            <UserRow key={user.id} user={user} isSelf={me.data?.id === user.id} busy={update.isPending && update.variables?.id === user.id} onChange={(change) => update.mutate({ id: user.id, ...change })} />
          ))}
        </FramedTable>
      )}
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
