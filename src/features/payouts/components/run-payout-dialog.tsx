import { useState } from 'react';
import type { OwedRow } from '../../../../shared/contracts/payouts';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TaxCaution } from '../../../components/caution-note';
import { Dialog } from '../../../components/dialog';
import { useCreatePayoutRun } from '../api/create-payout-run';
import { formatMoney, totalsFor } from './money';

/**
 * Confirms a payout run. One request key is made each time the dialog opens, so a double
 * click or a retried request returns the same run and pays nobody twice.
 */
export function RunPayoutDialog({ open, payable, onClose, onDone }: { open: boolean; payable: OwedRow[]; onClose: () => void; onDone: (message: string) => void }) {
  const run = useCreatePayoutRun();
  // Mounted afresh for each opening (see PayoutsPage), so each opening has its own key.
  const [requestKey] = useState(() => crypto.randomUUID());
  const confirm = () =>
    run.mutate(
      { requestKey, setterIds: [...new Set(payable.map((p) => p.setterId))] },
      {
        onSuccess: (res) => {
          const skipped = res.skipped.length ? ` Skipped: ${res.skipped.map((s) => `${s.setterName} (${s.reason})`).join(', ')}.` : '';
          onDone(`${res.run.payouts.length} payout${res.run.payouts.length === 1 ? '' : 's'} sent to the provider (${totalsFor(res.run.payouts)}).${skipped}`);
        },
      },
    );
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Run a payout"
      footer={
        <>
          <Button onClick={onClose}>Cancel</Button>
          <Button variant="primary" busy={run.isPending} onClick={confirm} disabled={payable.length === 0}>
            Pay {totalsFor(payable.map((p) => ({ amountMinor: p.owedMinor, currency: p.currency })))}
          </Button>
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <ErrorAlert error={run.error} title="The payout run did not start" />
        <p>These setters will be paid what they are owed, through the payments provider:</p>
        <ul className="flex flex-col gap-1 text-sm">
          {payable.map((p) => (
            <li key={`${p.setterId}-${p.currency}`} className="flex justify-between gap-4">
              <span>{p.setterName}</span>
              <span className="tabular-nums">{formatMoney(p.owedMinor, p.currency)}</span>
            </li>
          ))}
        </ul>
        <p className="text-sm text-ink-muted">Setters without finished payout details are left out; they stay owed.</p>
        <TaxCaution />
      </div>
    </Dialog>
  );
}
