import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { eventTypes, webhookEndpointBodySchema, type EventType, type WebhookDelivery, type WebhookEndpoint } from '../../../../shared/contracts/integrations';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { CheckboxField } from '../../../components/checkbox-field';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { Dialog } from '../../../components/dialog';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Card, Loading, Page } from '../../../components/page';
import { PlainTable } from '../../../components/plain-table';
import { StatusBadge } from '../../../components/status-badge';
import { TextField } from '../../../components/text-field';
import { formatDateTime } from '../../../lib/format';
import { useCreateEndpoint, useDeleteEndpoint, useDeliveries, useDelivery, useEndpoints, useReceipts, useResendDelivery, useRotateSecret, useUpdateEndpoint } from '../api/webhooks';
import { SecretOnce } from './secret-once';

const eventWords: Record<EventType, string> = {
  'edition.published': 'an edition is published',
  'edition.proof_sent': 'a proof goes to the printer',
  'edition.proof_returned': 'the printer returns a proof',
  'edition.approved': 'the printer approves a proof',
  'submission.reviewed': 'a submission is accepted or rejected',
  'foundry.run_finished': 'a foundry run ends',
  'payout.paid': 'a setter’s payout is paid',
};

const deliveryTone = { pending: 'warning', delivered: 'success', failed: 'danger' } as const;
const deliveryWords = { pending: 'Waiting', delivered: 'Delivered', failed: 'Given up' } as const;
const localReceiverPath = '/api/webhooks/local-receiver';

function NewEndpointDialog({ open, onClose, onMade }: { open: boolean; onClose: () => void; onMade: (secret: string, endpoint: WebhookEndpoint) => void }) {
  const create = useCreateEndpoint();
  const {
    register,
    handleSubmit,
    reset,
    setValue,
    formState: { errors },
  } = useForm({ resolver: zodResolver(webhookEndpointBodySchema), defaultValues: { url: '', description: '', events: [...eventTypes] as EventType[] } });
  const close = () => {
    reset();
    create.reset();
    onClose();
  };
  const onSubmit = handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (made) => {
        onMade(made.secret, made.endpoint);
        close();
      },
    }),
  );
  return (
    <Dialog open={open} onClose={close} title="Register an endpoint">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        <ErrorAlert error={create.error} title="Could not register the endpoint" />
        <TextField label="URL" hint="Deliveries are POSTed here, and only here: redirects are not followed." placeholder="https://desk.example.org/hooks/squarewright" {...register('url')} error={errors.url?.message} />
        <div>
          <Button size="sm" variant="ghost" onClick={() => setValue('url', `${window.location.origin}${localReceiverPath}`, { shouldValidate: true })}>
            Use the local receiver (development and demo)
          </Button>
        </div>
        <TextField label="Description" hint="Who receives it and why." {...register('description')} error={errors.description?.message} />
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 text-sm font-medium">Send when</legend>
          {eventTypes.map((e) => (
            <CheckboxField key={e} value={e} label={<><code className="font-mono text-xs">{e}</code>: {eventWords[e]}</>} {...register('events')} />
          ))}
          {errors.events ? <p className="text-sm font-medium text-danger">Choose at least one event.</p> : null}
        </fieldset>
        <div className="flex justify-end gap-2">
          <Button onClick={close}>Cancel</Button>
          <Button type="submit" variant="primary" busy={create.isPending}>
            Register
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function DeliveryDrawer({ id, onClose }: { id: string | null; onClose: () => void }) {
  const d = useDelivery(id);
  const resend = useResendDelivery();
  return (
    <Dialog open={id !== null} onClose={onClose} title={`Delivery ${id ?? ''}`} placement="right">
      {d.isPending ? (
        <Loading />
      ) : d.error ? (
        <ErrorAlert error={d.error} title="Could not read the delivery" />
      ) : (
        <div className="flex flex-col gap-4">
          <dl className="grid grid-cols-[8rem_1fr] gap-x-3 gap-y-1 text-sm">
            <dt className="text-ink-muted">Event</dt>
            <dd><code className="font-mono">{d.data.eventType}</code> <span className="text-ink-muted">({d.data.eventId})</span></dd>
            <dt className="text-ink-muted">To</dt>
            <dd className="break-all"><code>{d.data.url}</code></dd>
            <dt className="text-ink-muted">Status</dt>
            <dd><StatusBadge tone={deliveryTone[d.data.status]}>{deliveryWords[d.data.status]}</StatusBadge></dd>
            {d.data.nextAttemptAt ? (
              <>
                <dt className="text-ink-muted">Next attempt</dt>
                <dd className="tabular-nums">{formatDateTime(d.data.nextAttemptAt)}</dd>
              </>
            ) : null}
          </dl>
          <div>
            <ErrorAlert error={resend.error} title="Could not send it again" />
            <Button size="sm" busy={resend.isPending} onClick={() => resend.mutate(d.data.id)}>
              Send again now
            </Button>
          </div>
          <h3 className="font-semibold">Attempts</h3>
          {d.data.history.length === 0 ? (
            <p className="text-sm text-ink-muted">None yet.</p>
          ) : (
            <PlainTable caption="Attempts" headings={['When', 'Answer', { label: 'ms', numeric: true }, 'Said']} dense>
              {d.data.history.map((a, i) => (
                <tr key={i} className="border-b border-rule align-top">
                  <td className="px-2 py-1 whitespace-nowrap tabular-nums">{formatDateTime(a.at)}</td>
                  <td className="px-2 py-1">{a.status ?? 'none'}</td>
                  <td className="px-2 py-1 text-right tabular-nums">{a.ms}</td>
                  <td className="px-2 py-1 font-mono text-xs break-all">{a.answer || '(empty)'}</td>
                </tr>
              ))}
            </PlainTable>
          )}
          <h3 className="font-semibold">Body sent</h3>
          <pre className="overflow-x-auto rounded-md border border-rule bg-paper-deep p-3 font-mono text-xs">{JSON.stringify(JSON.parse(d.data.payload), null, 2)}</pre>
        </div>
      )}
    </Dialog>
  );
}

function lastAnswer(d: WebhookDelivery): string {
  if (!d.lastAttempt) return 'not tried yet';
  return d.lastAttempt.status !== null ? `${d.lastAttempt.status}` : d.lastAttempt.answer;
}

/** /admin/webhooks: endpoints that get our events, every delivery with its attempts, and the local receiver. */
export function WebhooksPage() {
  const endpoints = useEndpoints();
  const [page, setPage] = useState(1);
  const deliveries = useDeliveries(page);
  const receipts = useReceipts();
  const update = useUpdateEndpoint();
  const remove = useDeleteEndpoint();
  const rotate = useRotateSecret();
  const [making, setMaking] = useState(false);
  const [secret, setSecret] = useState<{ url: string; secret: string } | null>(null);
  const [removing, setRemoving] = useState<WebhookEndpoint | null>(null);
  const [open, setOpen] = useState<string | null>(null);
  return (
    <Page
      title="Webhooks"
      description="Other systems are told when something happens here: each delivery is signed with the endpoint’s secret and retried until it is answered. See the README, “Integrations”, for the signature check."
      actions={
        <Button variant="primary" onClick={() => setMaking(true)}>
          Register an endpoint
        </Button>
      }
    >
      {secret ? (
        <SecretOnce title={`Signing secret for ${secret.url}`} secret={secret.secret}>
          <div className="mt-2">
            <Button size="sm" onClick={() => setSecret(null)}>
              I have copied it
            </Button>
          </div>
        </SecretOnce>
      ) : null}
      <ErrorAlert error={update.error ?? rotate.error} title="Could not change the endpoint" />
      {endpoints.isPending ? (
        <Loading />
      ) : endpoints.error ? (
        <ErrorAlert error={endpoints.error} title="Could not read the endpoints" />
      ) : endpoints.data.length === 0 ? (
        <EmptyState title="No endpoints yet">Register the URL of a system that should hear about published editions, proofs, reviews, foundry runs or payouts.</EmptyState>
      ) : (
        <FramedTable caption="Endpoints" headings={['URL', 'Events', 'Waiting', 'Given up', 'State', '']} ruledHead>
          {endpoints.data.map((e) => (
            <tr key={e.id} className="border-b border-rule last:border-b-0 align-top">
              <td className="px-3 py-2">
                <code className="break-all">{e.url}</code>
                {e.description ? <div className="text-xs text-ink-muted">{e.description}</div> : null}
              </td>
              <td className="px-3 py-2"><span className="flex flex-wrap gap-1">{e.events.map((x) => <code key={x} className="rounded bg-paper-deep px-1 font-mono text-xs">{x}</code>)}</span></td>
              <td className="px-3 py-2 tabular-nums">{e.pending}</td>
              <td className="px-3 py-2 tabular-nums">{e.failed}</td>
              <td className="px-3 py-2"><StatusBadge tone={e.active ? 'success' : 'neutral'}>{e.active ? 'Active' : 'Paused'}</StatusBadge></td>
              <td className="px-3 py-2">
                <span className="flex flex-wrap justify-end gap-1">
                  <Button size="sm" onClick={() => update.mutate({ id: e.id, active: !e.active })}>{e.active ? 'Pause' : 'Resume'}</Button>
                  <Button size="sm" onClick={() => rotate.mutate(e.id, { onSuccess: (r) => setSecret({ url: r.endpoint.url, secret: r.secret }) })}>New secret</Button>
                  <Button size="sm" variant="danger" onClick={() => setRemoving(e)}>Remove</Button>
                </span>
              </td>
            </tr>
          ))}
        </FramedTable>
      )}

      <h2 className="mt-6 text-lg font-semibold">Deliveries</h2>
      {deliveries.isPending ? (
        <Loading />
      ) : deliveries.error ? (
        <ErrorAlert error={deliveries.error} title="Could not read the deliveries" />
      ) : deliveries.data.items.length === 0 ? (
        <EmptyState title="Nothing sent yet">Deliveries appear here as events happen.</EmptyState>
      ) : (
        <>
          <FramedTable caption="Deliveries" headings={['Event', 'To', 'Status', { label: 'Attempts', numeric: true }, 'Last answer', 'Made', '']} ruledHead>
            {deliveries.data.items.map((d) => (
              <tr key={d.id} className="border-b border-rule last:border-b-0 align-top">
                <td className="px-3 py-2"><code className="font-mono text-xs">{d.eventType}</code></td>
                <td className="px-3 py-2 max-w-64 truncate" title={d.url}><code className="text-xs">{d.url}</code></td>
                <td className="px-3 py-2"><StatusBadge tone={deliveryTone[d.status]}>{deliveryWords[d.status]}</StatusBadge></td>
                <td className="px-3 py-2 text-right tabular-nums">{d.attempts}</td>
                <td className="px-3 py-2 max-w-56 truncate text-ink-muted" title={d.lastAttempt?.answer ?? ''}>{lastAnswer(d)}</td>
                <td className="px-3 py-2 whitespace-nowrap text-ink-muted tabular-nums">{formatDateTime(d.createdAt)}</td>
                <td className="px-3 py-2 text-right"><Button size="sm" onClick={() => setOpen(d.id)}>Attempts</Button></td>
              </tr>
            ))}
          </FramedTable>
          <div className="mt-2 flex items-center gap-2 text-sm">
            <Button size="sm" disabled={page <= 1} onClick={() => setPage(page - 1)}>Newer</Button>
            <span className="text-ink-muted">Page {page} of {Math.max(1, Math.ceil(deliveries.data.total / deliveries.data.pageSize))}</span>
            <Button size="sm" disabled={page * deliveries.data.pageSize >= deliveries.data.total} onClick={() => setPage(page + 1)}>Older</Button>
          </div>
        </>
      )}

      {receipts.data ? (
        <Card title="Local receiver" className="mt-6">
          <p className="mb-2 text-sm text-ink-muted">
            What this server’s own receiver at <code>{localReceiverPath}</code> caught, with its check of the signature (as a receiving system would do it). Development and demo only; nothing here left this machine.
          </p>
          {receipts.data.length === 0 ? (
            <p className="text-sm text-ink-muted">Nothing caught yet.</p>
          ) : (
            <PlainTable caption="Caught deliveries" headings={['Received', 'Event', 'Signature', 'Body']} dense>
              {receipts.data.slice(0, 25).map((r) => (
                <tr key={r.id} className="border-b border-rule align-top">
                  <td className="px-2 py-1 whitespace-nowrap tabular-nums">{formatDateTime(r.receivedAt)}</td>
                  <td className="px-2 py-1"><code className="font-mono text-xs">{r.eventType ?? '?'}</code></td>
                  <td className="px-2 py-1"><StatusBadge tone={r.signatureValid ? 'success' : 'danger'}>{r.signatureValid ? 'Valid' : 'Does not check'}</StatusBadge></td>
                  <td className="px-2 py-1 max-w-96 truncate font-mono text-xs" title={r.body}>{r.body}</td>
                </tr>
              ))}
            </PlainTable>
          )}
        </Card>
      ) : null}

      <NewEndpointDialog open={making} onClose={() => setMaking(false)} onMade={(s, e) => setSecret({ url: e.url, secret: s })} />
      <DeliveryDrawer id={open} onClose={() => setOpen(null)} />
      <ConfirmDialog
        open={removing !== null}
        title="Remove this endpoint?"
        confirmLabel="Remove the endpoint"
        confirmVariant="danger"
        busy={remove.isPending}
        error={remove.error}
        onCancel={() => {
          remove.reset();
          setRemoving(null);
        }}
        onConfirm={() => removing && remove.mutate(removing.id, { onSuccess: () => setRemoving(null) })}
      >
        Nothing more is sent to <code>{removing?.url}</code>, and its deliveries and their history are deleted.
      </ConfirmDialog>
    </Page>
  );
}
