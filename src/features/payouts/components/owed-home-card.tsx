import { ErrorAlert } from '../../../components/alert';
import { Loading } from '../../../components/page';
import { usePayouts } from '../api/get-payouts';
import { totalsFor } from './money';

/** Home card (editor): setters owed, how many can be paid now, and payouts needing a retry. */
export function OwedHomeCard() {
  const overview = usePayouts();
  if (overview.isPending) return <Loading />;
  if (overview.error) return <ErrorAlert error={overview.error} title="Could not load payouts" />;
  const owed = overview.data.owed;
  const setters = new Set(owed.map((o) => o.setterId)).size;
  const payable = new Set(owed.filter((o) => o.detailsStatus === 'ready').map((o) => o.setterId)).size;
  const failed = overview.data.runs.flatMap((r) => r.payouts).filter((p) => p.state === 'failed').length;
  if (setters === 0 && failed === 0) return <p className="text-sm text-ink-muted">Nobody is owed anything.</p>;
  return (
    <div className="flex flex-col gap-1 text-sm">
      <p>
        <span className="font-semibold">{setters}</span> setter{setters === 1 ? '' : 's'} owed{' '}
        <span className="font-semibold tabular-nums">{totalsFor(owed.map((o) => ({ amountMinor: o.owedMinor, currency: o.currency })))}</span>
      </p>
      <p className="text-ink-muted">{payable} with payout details, ready to pay.</p>
      {failed > 0 ? <p className="text-danger">{failed} failed payout{failed === 1 ? '' : 's'} to retry.</p> : null}
    </div>
  );
}
