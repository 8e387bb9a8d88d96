import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { apiKeyScopes, createApiKeyBodySchema, type ApiKey, type ApiKeyScope } from '../../../../shared/contracts/integrations';
import { useMe } from '../../../api/session';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { CheckboxField } from '../../../components/checkbox-field';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Dialog } from '../../../components/dialog';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Loading, Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { TextField } from '../../../components/text-field';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useApiKeys, useCreateApiKey, useRevokeApiKey } from '../api/api-keys';
import { SecretOnce } from './secret-once';

const scopeWords: Record<ApiKeyScope, string> = {
  'stock:read': 'Read the stock (list, details, images, exports)',
  'submissions:read': 'Read submissions',
  'submissions:write': 'Check tilings, accept and reject submissions',
  'puzzles:read': 'Read puzzles',
  'puzzles:write': 'Make and change puzzles',
  'editions:read': 'Read editions, publications and the published-content feed',
  'foundry:read': 'Read foundry runs and their results',
  'foundry:write': 'Start and cancel foundry runs',
};

const statusTone = { active: 'success', expired: 'neutral', revoked: 'danger' } as const;

function NewKeyDialog({ open, onClose, onMade }: { open: boolean; onClose: () => void; onMade: (made: { apiKey: ApiKey; secret: string }) => void }) {
  const create = useCreateApiKey();
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm({ resolver: zodResolver(createApiKeyBodySchema), defaultValues: { name: '', scopes: [] as ApiKeyScope[], expiresInDays: 90 } });
  const close = () => {
    reset();
    create.reset();
    onClose();
  };
  const onSubmit = handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (made) => {
        onMade(made);
        close();
      },
    }),
  );
  return (
    <Dialog open={open} onClose={close} title="Make an API key">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <ErrorAlert error={create.error} title="Could not make the key" />
        <TextField label="Name" hint="What the key is for, e.g. “web team feed” or “nightly stock export”." {...register('name')} error={errors.name?.message} />
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 text-sm font-medium">What it may do</legend>
          {apiKeyScopes.map((s) => (
            <CheckboxField key={s} value={s} label={<><code className="font-mono text-xs">{s}</code> {scopeWords[s]}</>} {...register('scopes')} />
          ))}
          {errors.scopes ? <p className="text-sm font-medium text-danger">Choose at least one.</p> : null}
        </fieldset>
        <TextField label="Expires after (days)" type="number" min={1} max={365} {...register('expiresInDays', { valueAsNumber: true })} error={errors.expiresInDays?.message} />
        <p className="text-sm text-ink-muted">The key acts as you: it can never do more than your role may, and only what you tick here.</p>
        <div className="flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" busy={create.isPending}>
            Make the key
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/** /api-keys: keys for scripts and other systems (editors their own; admins see every key). */
export function ApiKeysPage() {
  const me = useMe();
  const keys = useApiKeys();
  const revoke = useRevokeApiKey();
  const [making, setMaking] = useState(false);
  const [made, setMade] = useState<{ apiKey: ApiKey; secret: string } | null>(null);
  const [revoking, setRevoking] = useState<ApiKey | null>(null);
  const isAdmin = me.data?.role === 'admin';
  const origin = window.location.origin;
  return (
    <Page
      title="API keys"
      description="Keys let scripts and other systems use the API as you, limited to the scopes you choose. Send one as “Authorization: Bearer <key>”."
      actions={
        <Button variant="primary" onClick={() => setMaking(true)}>
          Make an API key
        </Button>
      }
    >
      {made ? (
        <SecretOnce title={`Your new key “${made.apiKey.name}”`} secret={made.secret}>
          <p className="mt-2 text-sm">Try it:</p>
          <code className="block rounded-md border border-rule bg-surface px-3 py-2 font-mono text-xs break-all">
            curl -H &quot;Authorization: Bearer {made.secret}&quot; {origin}/api/{made.apiKey.scopes.includes('editions:read') ? 'feed/editions' : 'stock?pageSize=5'}
          </code>
          <div className="mt-2">
            <Button size="sm" onClick={() => setMade(null)}>
              I have copied it
            </Button>
          </div>
        </SecretOnce>
      ) : null}
      {keys.isPending ? (
        <Loading />
      ) : keys.error ? (
        <ErrorAlert error={keys.error} title="Could not read the keys" />
      ) : keys.data.length === 0 ? (
        <EmptyState title="No API keys yet">Make one for each script or system, with only the scopes it needs.</EmptyState>
      ) : (
        <FramedTable caption="API keys" headings={['Name', 'Key', 'Scopes', ...(isAdmin ? ['Owner'] : []), 'Made', 'Expires', 'Last used', 'Status', '']} ruledHead>
          {keys.data.map((k) => (
            <tr key={k.id} className="border-b border-rule last:border-b-0 align-top">
              <td className="px-3 py-2 font-medium">{k.name}</td>
              <td className="px-3 py-2"><code className="font-mono text-xs text-ink-soft">{k.start ? `${k.start}…` : '—'}</code></td>
              <td className="px-3 py-2"><span className="flex flex-wrap gap-1">{k.scopes.map((s) => <code key={s} className="rounded bg-paper-deep px-1 font-mono text-xs">{s}</code>)}</span></td>
              {isAdmin ? <td className="px-3 py-2 text-ink-muted">{k.owner.name}</td> : null}
              <td className="px-3 py-2 whitespace-nowrap text-ink-muted tabular-nums">{formatDate(k.createdAt)}</td>
              <td className="px-3 py-2 whitespace-nowrap text-ink-muted tabular-nums">{k.expiresAt ? formatDate(k.expiresAt) : 'never'}</td>
              <td className="px-3 py-2 whitespace-nowrap text-ink-muted tabular-nums">{k.lastUsedAt ? formatDateTime(k.lastUsedAt) : 'not yet'}</td>
              <td className="px-3 py-2"><StatusBadge tone={statusTone[k.status]}>{k.status === 'active' ? 'Active' : k.status === 'expired' ? 'Expired' : 'Revoked'}</StatusBadge></td>
              <td className="px-3 py-2 text-right">
                {k.status === 'active' ? (
                  <Button size="sm" variant="danger" onClick={() => setRevoking(k)}>
                    Revoke
                  </Button>
                ) : null}
              </td>
            </tr>
          ))}
        </FramedTable>
      )}
      <NewKeyDialog open={making} onClose={() => setMaking(false)} onMade={setMade} />
      <ConfirmDialog
        open={revoking !== null}
        title={`Revoke “${revoking?.name ?? ''}”?`}
        confirmLabel="Revoke the key"
        confirmVariant="danger"
        busy={revoke.isPending}
        error={revoke.error}
        onCancel={() => {
          revoke.reset();
          setRevoking(null);
        }}
        onConfirm={() => revoking && revoke.mutate(revoking.id, { onSuccess: () => setRevoking(null) })}
      >
        The next request made with this key is refused. This cannot be undone; make a new key if the script still needs one.
      </ConfirmDialog>
    </Page>
  );
}
