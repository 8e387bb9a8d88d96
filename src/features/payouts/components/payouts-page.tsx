import { useState } from 'react';
import { formatMoney, totalsFor } from './money';
import type { OwedRow, Payout, PayoutRun } from '../../../../shared/contracts/payouts';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TaxCaution } from '../../../components/caution-note';
import { EmptyState } from '../../../components/empty-state';
import { Card, Loading, Page } from '../../../components/page';
import { PayoutStateBadge } from '../../../components/payout-state-badge';
import { PlainTable } from '../../../components/plain-table';
import { StatusBadge } from '../../../components/status-badge';
import { formatDateTime } from '../../../lib/format';
import { usePayouts } from '../api/get-payouts';
import { useRetryPayout } from '../api/retry-payout';
import { CorrectionDialog } from './correction-dialog';
import { RunPayoutDialog } from './run-payout-dialog';

/** /payouts (editor): what each setter is owed, payout runs and their results. */
export function PayoutsPage() {
  const overview = usePayouts();
  const retry = useRetryPayout();
  const [confirming, setConfirming] = useState(false);
  const [correcting, setCorrecting] = useState<OwedRow | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const payable = overview.data?.owed.filter((o) => o.detailsStatus === 'ready') ?? [];
  return (
    <Page
      title="Payouts"
      description="Fees accrue when an edition is published. Pay what is owed through the payments provider; each payout is confirmed by the provider before it shows as paid."
      actions={
        <Button variant="primary" disabled={payable.length === 0} onClick={() => setConfirming(true)}>
          Run a payout…
        </Button>
      }
    >
      <TaxCaution />
      {notice ? <Alert tone="success" title="Payout run started">{notice}</Alert> : null}
      <ErrorAlert error={retry.error} title="The retry did not start" />
      {overview.isPending ? (
        <Loading />
      ) : overview.error ? (
        <ErrorAlert error={overview.error} title="Could not load payouts" />
      ) : (
        <>
          <Card title="Owed now">
            {overview.data.owed.length === 0 ? (
              <EmptyState title="Nobody is owed anything">Fees appear here when an edition with their puzzles is published.</EmptyState>
            ) : (
              <>
                <OwedTable rows={overview.data.owed} onCorrect={setCorrecting} />
                {payable.length === 0 ? (
                  <p className="text-sm text-ink-muted">Nobody owed has finished payout details yet, so there is nothing to pay. Setters add them on their Earnings page.</p>
                ) : null}
              </>
            )}
          </Card>
          <section aria-labelledby="runs-heading" className="flex flex-col gap-3">
            <h2 id="runs-heading" className="text-lg font-semibold">Payout runs</h2>
            {overview.data.runs.length === 0 ? (
              <EmptyState title="No payout runs yet" />
            ) : (
              overview.data.runs.map((run) => (
                <RunCard key={run.id} run={run} retryingId={retry.isPending ? (retry.variables ?? null) : null} onRetry={(id) => retry.mutate(id)} />
              ))
            )}
          </section>
        </>
      )}
      {confirming ? (
        <RunPayoutDialog
        open
        payable={payable}
        onClose={() => setConfirming(false)}
        onDone={(message) => {
          setNotice(message);
          setConfirming(false);
        }}
        />
      ) : null}
      {correcting ? <CorrectionDialog key={`${correcting.setterId}-${correcting.currency}`} row={correcting} onClose={() => setCorrecting(null)} /> : null}
    </Page>
  );
}

function detailsBadge(row: OwedRow) {
  if (row.detailsStatus === 'ready') return <StatusBadge tone="success">{row.detailsHint ?? 'Ready'}</StatusBadge>;
  if (row.detailsStatus === 'onboarding') return <StatusBadge tone="warning">Details not finished</StatusBadge>;
  return <StatusBadge tone="neutral">No payout details</StatusBadge>;
}

function OwedTable({ rows, onCorrect }: { rows: OwedRow[]; onCorrect: (row: OwedRow) => void }) {
  return (
    <div className="overflow-x-auto">
      <PlainTable caption="Owed per setter" headings={['Setter', { label: 'Owed', numeric: true }, 'Payout details', '']} shadedHead>
        {rows.map((row) => (
          <tr key={`${row.setterId}-${row.currency}`} className="border-b border-rule last:border-b-0">
            <td className="px-3 py-2">
              <span className="font-medium">{row.setterName}</span> <code className="text-ink-muted">{row.email}</code>
            </td>
            <td className="px-3 py-2 text-right tabular-nums">{formatMoney(row.owedMinor, row.currency)}</td>
            <td className="px-3 py-2">{detailsBadge(row)}</td>
            <td className="px-3 py-2 text-right">
              <Button size="sm" variant="ghost" onClick={() => onCorrect(row)} aria-label={`Add a correction for ${row.setterName}`}>
                Correction…
              </Button>
            </td>
          </tr>
        ))}
      </PlainTable>
    </div>
  );
}

function RunCard({ run, retryingId, onRetry }: { run: PayoutRun; retryingId: string | null; onRetry: (id: string) => void }) {
  const counts = { paid: 0, pending: 0, failed: 0 };
  for (const p of run.payouts) counts[p.state] += 1;
  return (
    <Card
      title={
        <span>
          Run of {formatDateTime(run.createdAt)} <span className="font-normal text-ink-muted">by {run.createdByName}</span>
        </span>
      }
    >
      <p className="text-sm text-ink-muted">
        {totalsFor(run.payouts)} · {counts.paid} paid, {counts.pending} pending, {counts.failed} failed
      </p>
      <PlainTable caption={`Payouts of the run of ${formatDateTime(run.createdAt)}`} headings={['Setter', { label: 'Amount', numeric: true }, 'State', 'Note', '']}>
        {run.payouts.map((p) => (
          <PayoutRow key={p.id} payout={p} retrying={retryingId === p.id} onRetry={() => onRetry(p.id)} />
        ))}
      </PlainTable>
    </Card>
  );
}

function PayoutRow({ payout, retrying, onRetry }: { payout: Payout; retrying: boolean; onRetry: () => void }) {
  const note =
    payout.state === 'failed'
      ? payout.failureMessage ?? 'The provider refused the payout.'
      : payout.state === 'paid'
        ? `Paid ${payout.paidAt ? formatDateTime(payout.paidAt) : ''}`
        : 'Waiting for the provider to confirm';
  return (
    <tr className="border-b border-rule last:border-b-0">
      <td className="px-3 py-2 font-medium">{payout.setterName}</td>
      <td className="px-3 py-2 text-right tabular-nums">{formatMoney(payout.amountMinor, payout.currency)}</td>
      <td className="px-3 py-2">
        <PayoutStateBadge state={payout.state} />
        {payout.attempt > 1 ? <span className="ml-2 text-xs text-ink-muted">attempt {payout.attempt}</span> : null}
      </td>
      <td className="px-3 py-2 text-ink-soft">{note}</td>
      <td className="px-3 py-2 text-right">
        {payout.state === 'failed' ? (
          <Button size="sm" busy={retrying} onClick={onRetry} aria-label={`Retry the payout to ${payout.setterName}`}>
            Retry
          </Button>
        ) : null}
      </td>
    </tr>
  );
}
