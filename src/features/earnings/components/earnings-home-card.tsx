import { formatMoney } from '../../../../shared/contracts/ledger';
import { ErrorAlert } from '../../../components/alert';
import { Loading } from '../../../components/page';
import { PayoutStateBadge } from '../../../components/payout-state-badge';
import { useEarnings } from '../api/get-earnings';

/** Home card (setter): fees this month, what is owed, and the latest payout. */
export function EarningsHomeCard() {
  const earnings = useEarnings();
  if (earnings.isPending) return <Loading />;
  if (earnings.error) return <ErrorAlert error={earnings.error} title="Could not load your earnings" />;
  const thisMonth = earnings.data.statements.find((s) => s.month === earnings.data.month);
  const latest = earnings.data.payouts[0];
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        This month:{' '}
        <span className="font-semibold tabular-nums">{thisMonth ? thisMonth.totals.map((t) => formatMoney(t.amountMinor, t.currency)).join(' + ') : formatMoney(0, 'GBP')}</span>
      </p>
      <p>
        Owed to you:{' '}
        <span className="font-semibold tabular-nums">{earnings.data.owed.length ? earnings.data.owed.map((o) => formatMoney(o.amountMinor, o.currency)).join(' + ') : formatMoney(0, 'GBP')}</span>
      </p>
      {latest ? (
        <p className="flex items-center gap-2">
          Latest payout: <span className="tabular-nums">{formatMoney(latest.amountMinor, latest.currency)}</span> <PayoutStateBadge state={latest.state} />
        </p>
      ) : null}
      {!earnings.data.details || earnings.data.details.status !== 'ready' ? <p className="text-ink-muted">Add your payout details to be paid.</p> : null}
    </div>
  );
}
