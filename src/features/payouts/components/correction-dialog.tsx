import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { ledgerCorrectionInputSchema, type LedgerCorrectionInput } from '../../../../shared/contracts/ledger';
import type { OwedRow } from '../../../../shared/contracts/payouts';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Dialog } from '../../../components/dialog';
import { TextField } from '../../../components/text-field';
import { useAddCorrection } from '../api/add-correction';
import { formatMoney } from './money';

/** Adds a correction (a new ledger entry with a reason) for one setter; nothing is edited. */
export function CorrectionDialog({ row, onClose }: { row: OwedRow | null; onClose: () => void }) {
  const add = useAddCorrection();
  // Mounted afresh per setter (see PayoutsPage), so the defaults are that setter's.
  const { register, handleSubmit, formState: { errors } } = useForm<LedgerCorrectionInput>({
    resolver: zodResolver(ledgerCorrectionInputSchema),
    defaultValues: { setterId: row?.setterId ?? '', amountMinor: 0, currency: row?.currency ?? 'GBP', reason: '' },
  });
  const onSubmit = handleSubmit((values) => add.mutate(values, { onSuccess: onClose }));
  return (
    <Dialog open={row !== null} onClose={onClose} title={row ? `Correction for ${row.setterName}` : 'Correction'}>
      {row ? (
        <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
          <ErrorAlert error={add.error} title="The correction was not saved" />
          <p className="text-sm text-ink-muted">
            Owed now: {formatMoney(row.owedMinor, row.currency)}. A correction is a new entry in the ledger; earlier entries stay as they are.
          </p>
          <TextField
            label={`Amount in minor units (${row.currency} cents or pence; negative to reduce)`}
            type="number"
            step={1}
            {...register('amountMinor', { valueAsNumber: true })}
            error={errors.amountMinor?.message}
          />
          <TextField label="Reason" {...register('reason')} error={errors.reason?.message} />
          <div className="flex justify-end gap-2">
            <Button onClick={onClose}>Cancel</Button>
            <Button type="submit" variant="primary" busy={add.isPending}>Add the correction</Button>
          </div>
        </form>
      ) : null}
    </Dialog>
  );
}
