import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useSearchParams } from 'react-router-dom';
import { formatMoney } from '../../../../shared/contracts/ledger';
import { payoutDetailsInputSchema, type Earnings, type PayoutDetailsInput } from '../../../../shared/contracts/payouts';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button, buttonClasses } from '../../../components/button';
import { CautionNote } from '../../../components/caution-note';
import { EmptyState } from '../../../components/empty-state';
import { Card, Loading, Page } from '../../../components/page';
import { PayoutStateBadge } from '../../../components/payout-state-badge';
import { PlainTable } from '../../../components/plain-table';
import { SelectField } from '../../../components/select-field';
import { StatusBadge } from '../../../components/status-badge';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useEarnings } from '../api/get-earnings';
import { statementCsvUrl } from '../api/get-statement';
import { useSendStatement } from '../api/send-statement';
import { useStartPayoutDetails } from '../api/start-payout-details';
import { StatementDialog } from './statement-dialog';

/** /earnings (setter): fees, monthly statements, payouts and payout details. */
export function EarningsPage() {
  const earnings = useEarnings();
  const [params] = useSearchParams();
  const [viewing, setViewing] = useState<string | null>(null);
  return (
    <Page title="Earnings" description="Fees for your puzzles that went to print, what has been paid to you, and your monthly statements.">
      <SetterTaxNote />
      {params.get('details') === 'done' ? (
        <Alert tone="info" title="Back from the payments provider">Your payout details are being checked; the state below updates when the provider confirms them.</Alert>
      ) : null}
      {earnings.isPending ? (
        <Loading />
      ) : earnings.error ? (
        <ErrorAlert error={earnings.error} title="Could not load your earnings" />
      ) : (
        <>
          <div className="grid gap-4 md:grid-cols-2">
            <Card title="Owed to you">
              <p className="text-2xl font-semibold tabular-nums">
                {earnings.data.owed.length ? earnings.data.owed.map((o) => formatMoney(o.amountMinor, o.currency)).join(' + ') : formatMoney(0, 'GBP')}
              </p>
              <p className="text-sm text-ink-muted">Paid in the editors’ next payout run, once your payout details are finished.</p>
            </Card>
            <PayoutDetailsCard details={earnings.data.details} />
          </div>
          <PayoutsCard payouts={earnings.data.payouts} />
          <StatementsCard statements={earnings.data.statements} onView={setViewing} />
          <EntriesCard entries={earnings.data.entries} />
        </>
      )}
      {viewing ? <StatementDialog month={viewing} onClose={() => setViewing(null)} /> : null}
    </Page>
  );
}

/** The setters' own tax caution (the editors see the standard TaxCaution). */
function SetterTaxNote() {
  return (
    <CautionNote title="Your fees and tax">
      Fees paid to you may count as taxable income where you live. Squarewright does not deduct or report tax for you:
      declaring this income is your responsibility. Keep your monthly statements for your records.
    </CautionNote>
  );
}

const countries = [
  { value: 'GB', label: 'United Kingdom' },
  { value: 'IE', label: 'Ireland' },
  { value: 'NL', label: 'Netherlands' },
  { value: 'DE', label: 'Germany' },
  { value: 'FR', label: 'France' },
  { value: 'US', label: 'United States' },
];

function PayoutDetailsCard({ details }: { details: Earnings['details'] }) {
  const start = useStartPayoutDetails();
  const { register, handleSubmit, formState: { errors } } = useForm<PayoutDetailsInput>({ resolver: zodResolver(payoutDetailsInputSchema), defaultValues: { country: 'GB' } });
  const onSubmit = handleSubmit((values) =>
    start.mutate(values, {
      onSuccess: (res) => {
        if (res.onboardingUrl) window.location.assign(res.onboardingUrl);
      },
    }),
  );
  return (
    <Card title="Payout details">
      {details ? (
        <p className="flex flex-wrap items-center gap-2">
          {details.status === 'ready' ? <StatusBadge tone="success">Ready</StatusBadge> : <StatusBadge tone="warning">Not finished</StatusBadge>}
          <span>{details.hint}</span>
        </p>
      ) : (
        <p>No payout details yet: you cannot be paid until you add them.</p>
      )}
      <p className="text-sm text-ink-muted">
        Your bank details are entered on the payments provider’s own page. Squarewright keeps only the provider’s reference to your account, never your bank or card numbers.
      </p>
      <ErrorAlert error={start.error} title="Could not open the provider’s page" />
      <form onSubmit={onSubmit} noValidate className="flex flex-wrap items-end gap-3">
        <SelectField label="Country of your bank account" options={countries} {...register('country')} error={errors.country?.message} />
        <Button type="submit" variant={details?.status === 'ready' ? 'secondary' : 'primary'} busy={start.isPending}>
          {details ? (details.status === 'ready' ? 'Change payout details' : 'Finish payout details') : 'Add payout details'}
        </Button>
      </form>
    </Card>
  );
}

function PayoutsCard({ payouts }: { payouts: Earnings['payouts'] }) {
  return (
    <Card title="Payouts to you">
      {payouts.length === 0 ? (
        <EmptyState title="No payouts yet" />
      ) : (
        <PlainTable caption="Payouts to you" headings={['Started', { label: 'Amount', numeric: true }, 'State', 'Note']}>
          {payouts.map((p) => (
            <tr key={p.id} className="border-b border-rule last:border-b-0">
              <td className="px-3 py-2 tabular-nums">{formatDateTime(p.createdAt)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{formatMoney(p.amountMinor, p.currency)}</td>
              <td className="px-3 py-2"><PayoutStateBadge state={p.state} /></td>
              <td className="px-3 py-2 text-ink-soft">
                {p.state === 'paid' && p.paidAt ? `Paid ${formatDateTime(p.paidAt)}` : p.state === 'failed' ? 'Not paid yet; the editors will retry it.' : 'On its way'}
              </td>
            </tr>
          ))}
        </PlainTable>
      )}
    </Card>
  );
}

function StatementsCard({ statements, onView }: { statements: Earnings['statements']; onView: (month: string) => void }) {
  const send = useSendStatement();
  return (
    <Card title="Monthly statements">
      {send.data ? <Alert tone="success" title="Statement sent">Your statement for {send.data.month} is on its way to {send.data.to}.</Alert> : null}
      <ErrorAlert error={send.error} title="The statement was not sent" />
      {statements.length === 0 ? (
        <EmptyState title="No statements yet">A statement appears for each month in which a puzzle of yours was printed.</EmptyState>
      ) : (
        <ul className="flex flex-col divide-y divide-rule">
          {statements.map((s) => (
            <li key={s.month} className="flex flex-wrap items-center justify-between gap-3 py-2">
              <span>
                <span className="font-medium">{formatMonth(s.month)}</span>{' '}
                <span className="text-ink-muted">
                  {s.entryCount} entr{s.entryCount === 1 ? 'y' : 'ies'} · {s.totals.map((t) => formatMoney(t.amountMinor, t.currency)).join(' + ')}
                </span>
              </span>
              <span className="flex gap-2">
                <Button size="sm" onClick={() => onView(s.month)} aria-label={`View the statement for ${formatMonth(s.month)}`}>View</Button>
                <a className={buttonClasses('secondary', 'sm')} href={statementCsvUrl(s.month)} download aria-label={`Download the statement for ${formatMonth(s.month)} as CSV`}>
                  CSV
                </a>
                <Button size="sm" busy={send.isPending && send.variables === s.month} onClick={() => send.mutate(s.month)} aria-label={`Mail me the statement for ${formatMonth(s.month)}`}>
                  Mail me
                </Button>
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

function EntriesCard({ entries }: { entries: Earnings['entries'] }) {
  return (
    <Card title="Ledger entries">
      {entries.length === 0 ? (
        <EmptyState title="No entries yet" />
      ) : (
        <PlainTable caption="Your ledger entries, newest first" headings={['Date', 'What', { label: 'Amount', numeric: true }]}>
          {entries.map((e) => (
            <tr key={e.id} className="border-b border-rule last:border-b-0">
              <td className="px-3 py-2 tabular-nums">{formatDate(e.date)}</td>
              <td className="px-3 py-2">
                {e.kind === 'fee' ? `Fee: ${e.puzzleKind === 'deduction' ? 'Deduction' : 'Assembly'} puzzle printed` : `Correction: ${e.reason ?? ''}`}
              </td>
              <td className="px-3 py-2 text-right tabular-nums">{formatMoney(e.amountMinor, e.currency)}</td>
            </tr>
          ))}
        </PlainTable>
      )}
    </Card>
  );
}

/** "November 2026" from "2026-11". */
export function formatMonth(month: string): string {
  const d = new Date(`${month}-01T00:00:00Z`);
  return Number.isNaN(d.getTime()) ? month : new Intl.DateTimeFormat('en-GB', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(d);
}
