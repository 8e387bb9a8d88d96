import { formatMoney } from '../../../../shared/contracts/ledger';
import { ErrorAlert } from '../../../components/alert';
import { Dialog } from '../../../components/dialog';
import { Loading } from '../../../components/page';
import { PlainTable } from '../../../components/plain-table';
import { formatDate } from '../../../lib/format';
import { statementCsvUrl, useStatement } from '../api/get-statement';

/** One month's statement on screen. */
export function StatementDialog({ month, onClose }: { month: string; onClose: () => void }) {
  const statement = useStatement(month);
  return (
    <Dialog open onClose={onClose} title={`Statement for ${month}`} placement="right">
      {statement.isPending ? (
        <Loading />
      ) : statement.error ? (
        <ErrorAlert error={statement.error} title="Could not load the statement" />
      ) : (
        <div className="flex flex-col gap-4">
          <p>
            {statement.data.setterName} · {statement.data.entries.length} entries ·{' '}
            <a className="underline" href={statementCsvUrl(month)} download>download as CSV</a>
          </p>
          <PlainTable
            caption={`Entries of ${month}`}
            headings={['Date', 'What', { label: 'Amount', numeric: true }]}
            dense
            footer={
              <>
                {statement.data.totals.map((t) => (
                  <tr key={t.currency}>
                    <th scope="row" colSpan={2} className="px-2 py-1 text-left">Total earned</th>
                    <td className="px-2 py-1 text-right font-semibold tabular-nums">{formatMoney(t.amountMinor, t.currency)}</td>
                  </tr>
                ))}
                {statement.data.paid.map((t) => (
                  <tr key={`paid-${t.currency}`}>
                    <th scope="row" colSpan={2} className="px-2 py-1 text-left">Paid out this month</th>
                    <td className="px-2 py-1 text-right tabular-nums">{formatMoney(t.amountMinor, t.currency)}</td>
                  </tr>
                ))}
              </>
            }
          >
            {statement.data.entries.map((e) => (
              <tr key={e.id} className="border-b border-rule">
                <td className="px-2 py-1 tabular-nums">{formatDate(e.date)}</td>
                <td className="px-2 py-1">{e.kind === 'fee' ? `Fee, ${e.puzzleKind ?? 'puzzle'}` : `Correction: ${e.reason ?? ''}`}</td>
                <td className="px-2 py-1 text-right tabular-nums">{formatMoney(e.amountMinor, e.currency)}</td>
              </tr>
            ))}
          </PlainTable>
        </div>
      )}
    </Dialog>
  );
}
