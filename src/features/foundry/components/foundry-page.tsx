import { Link } from 'react-router-dom';
import type { Run, RunState } from '../../../../shared/contracts/foundry';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Loading, Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { formatDateTime } from '../../../lib/format';
import { useCancelRun, useRetryRun } from '../api/cancel-run';
import { isActive, useRuns } from '../api/list-runs';
import { RunForm } from './run-form';
import { RunProgress } from './run-progress';

const stateTone: Record<RunState, 'info' | 'success' | 'warning' | 'danger' | 'neutral'> = {
  queued: 'neutral',
  running: 'info',
  done: 'success',
  cancelled: 'neutral',
  failed: 'danger',
  interrupted: 'warning',
};
const stateLabel: Record<RunState, string> = {
  queued: 'Queued',
  running: 'Running',
  done: 'Done',
  cancelled: 'Cancelled',
  failed: 'Failed',
  interrupted: 'Interrupted',
};

/** /foundry: start runs and watch them. */
export function FoundryPage() {
  const runs = useRuns();
  const cancel = useCancelRun();
  const retry = useRetryRun();
  return (
    <Page
      title="Foundry"
      description="Mint new tilings from 3-connected planar networks: every tiling of an order, random ones with filters, or squared squares joined from stock pairs. Perfect results go into the stock with provenance foundry (imperfect ones only when a run asks for them)."
    >
      <RunForm />
      <section aria-labelledby="runs-heading" className="flex flex-col gap-3">
        <h2 id="runs-heading" className="text-lg font-semibold text-ink">Runs</h2>
        <ErrorAlert error={cancel.error} title="Could not cancel" />
        <ErrorAlert error={retry.error} title="Could not run it again" />
        {runs.isPending ? (
          <Loading />
        ) : runs.error ? (
          <ErrorAlert error={runs.error} title="Could not load the runs" />
        ) : runs.data.length === 0 ? (
          <EmptyState title="No runs yet" />
        ) : (
          <FramedTable caption="Foundry runs" headings={['Run', 'State', 'Perfect found', 'Imperfect found', 'New in stock', 'Started', '']} ruledHead>
            {runs.data.map((run) => (
              <RunRow
                key={run.id}
                run={run}
                cancelling={cancel.isPending && cancel.variables === run.id}
                onCancel={() => cancel.mutate(run.id)}
                retrying={retry.isPending && retry.variables?.id === run.id}
                onRetry={(how) => retry.mutate({ id: run.id, how })}
              />
            ))}
          </FramedTable>
        )}
      </section>
    </Page>
  );
}

function RunRow({ run, cancelling, onCancel, retrying, onRetry }: { run: Run; cancelling: boolean; onCancel: () => void; retrying: boolean; onRetry: (how: 'resume' | 'restart') => void }) {
  return (
    <tr className="border-b border-rule align-top last:border-b-0" aria-label={`Run ${run.id}`}>
      <td className="min-w-72 px-3 py-2">
        <RunProgress run={run} />
        {run.error ? <p className="mt-1 text-xs text-danger">{run.error}</p> : null}
      </td>
      <td className="px-3 py-2">
        <StatusBadge tone={stateTone[run.state]}>{stateLabel[run.state]}</StatusBadge>
      </td>
      <td className="px-3 py-2 tabular-nums">{run.foundPerfect.toLocaleString('en-GB')}</td>
      <td className="px-3 py-2 tabular-nums">{run.foundImperfect.toLocaleString('en-GB')}</td>
      <td className="px-3 py-2 tabular-nums">{run.addedToStock.toLocaleString('en-GB')}</td>
      <td className="px-3 py-2 tabular-nums text-ink-muted">{formatDateTime(run.startedAt ?? run.createdAt)}</td>
      <td className="px-3 py-2 text-right">
        <div className="flex justify-end gap-2">
          <Link className="text-accent-strong underline" to={`/foundry/runs/${run.id}`}>
            Results
          </Link>
          {isActive(run) ? (
            <Button size="sm" variant="danger" busy={cancelling} onClick={onCancel}>
              Cancel
            </Button>
          ) : null}
          {/* an interrupted (server stopped), failed or cancelled run: on from its finished shards, or from the start */}
          {run.retry.resume ? (
            <Button size="sm" variant="primary" busy={retrying} onClick={() => onRetry('resume')} aria-label={`Resume run ${run.id}`}>
              Resume
            </Button>
          ) : null}
          {run.retry.restart ? (
            <Button size="sm" busy={retrying} onClick={() => onRetry('restart')} aria-label={`Restart run ${run.id}`}>
              Restart
            </Button>
          ) : null}
        </div>
      </td>
    </tr>
  );
}
