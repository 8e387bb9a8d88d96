import { useEffect, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { z } from 'zod';
import { editionCreateSchema, type EditionSummary } from '../../../../shared/contracts/editions';
import { useQuery } from '@tanstack/react-query';
import { editionListQueryOptions, useEditions } from '../../../api/editions';
import { usePublications } from '../../../api/publications';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { PrintCaution } from '../../../components/caution-note';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Card, Loading, Page } from '../../../components/page';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { formatDate } from '../../../lib/format';
import { useCreateEdition } from '../api/create-edition';
import { EditionStateBadge } from './edition-state-badge';

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];

function thisMonth(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}`;
}

function shiftMonth(month: string, by: number): string {
  const [y, m] = month.split('-').map(Number) as [number, number];
  const d = new Date(Date.UTC(y, m - 1 + by, 1));
  return `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
}

/** The weeks of a month as rows of 7 cells (Monday first), null outside the month. */
export function monthGrid(month: string): (string | null)[][] {
  const [y, m] = month.split('-').map(Number) as [number, number];
  const first = new Date(Date.UTC(y, m - 1, 1));
  const days = new Date(Date.UTC(y, m, 0)).getUTCDate();
  const lead = (first.getUTCDay() + 6) % 7;
  const cells: (string | null)[] = Array.from({ length: lead }, () => null);
  for (let d = 1; d <= days; d++) cells.push(`${month}-${String(d).padStart(2, '0')}`);
  while (cells.length % 7 !== 0) cells.push(null);
  const weeks: (string | null)[][] = [];
  for (let i = 0; i < cells.length; i += 7) weeks.push(cells.slice(i, i + 7));
  return weeks;
}

function Calendar({ month, editions }: { month: string; editions: EditionSummary[] }) {
  const byDay = new Map<string, EditionSummary[]>();
  for (const e of editions) byDay.set(e.date, [...(byDay.get(e.date) ?? []), e]);
  const [y, m] = month.split('-').map(Number) as [number, number];
  return (
    <table className="w-full table-fixed border-collapse text-sm">
      <caption className="sr-only">{`Editions in ${MONTHS[m - 1]} ${y}`}</caption>
      <thead>
        <tr>
          {WEEKDAYS.map((d) => (
            <th key={d} scope="col" className="border-b border-rule px-1 py-1 text-left font-semibold text-ink-muted">
              {d}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {monthGrid(month).map((week, i) => (
          <tr key={i}>
            {week.map((day, j) => (
              <td key={j} className="h-20 border border-rule align-top p-1">
                {day ? (
                  <div className="flex flex-col gap-1">
                    <span className="text-xs tabular-nums text-ink-muted">{Number(day.slice(8))}</span>
                    {(byDay.get(day) ?? []).map((e) => (
                      <Link key={e.id} to={`/editions/${e.id}`} className="flex flex-col rounded border border-rule bg-paper-deep px-1 py-0.5 text-xs">
                        <span className="truncate">{`${e.publicationTitle} No. ${e.number}`}</span>
                        <EditionStateBadge state={e.state} />
                      </Link>
                    ))}
                  </div>
                ) : null}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

const newEditionForm = editionCreateSchema.pick({ publicationId: true, date: true }).extend({
  number: z.coerce.number({ error: 'number must be a whole number' }).int('number must be a whole number').min(1, 'number must be at least 1'),
});
type NewEdition = z.input<typeof newEditionForm>;

/** The number a new edition of a publication takes by default: one after its highest, or 1 for its first. */
export function nextEditionNumber(items: readonly Pick<EditionSummary, 'number'>[]): number {
  return items.reduce((max, e) => Math.max(max, e.number), 0) + 1;
}

function NewEditionForm() {
  const pubs = usePublications();
  const create = useCreateEdition();
  const navigate = useNavigate();
  const form = useForm<NewEdition, unknown, z.output<typeof newEditionForm>>({ resolver: zodResolver(newEditionForm), defaultValues: { publicationId: '', number: 1, date: '' } });
  const { errors } = form.formState;
  const publicationId = useWatch({ control: form.control, name: 'publicationId' });
  // the publication's editions (every month): the number defaults to the next one
  const ofPublication = useQuery({ ...editionListQueryOptions({ publicationId }), enabled: publicationId !== '' });
  const next = publicationId && ofPublication.data ? nextEditionNumber(ofPublication.data) : null;
  useEffect(() => {
    if (next !== null && !form.getFieldState('number').isDirty) form.setValue('number', next);
  }, [next, form]);
  return (
    <Card title="New edition">
      <ErrorAlert error={pubs.error} />
      <form
        className="flex flex-col gap-3"
        noValidate
        onSubmit={form.handleSubmit(async (values) => {
          const ed = await create.mutateAsync(values).catch(() => null);
          if (ed) navigate(`/editions/${ed.id}`);
        })}
      >
        <SelectField label="Publication" placeholder="Choose…" options={(pubs.data ?? []).map((p) => ({ value: p.id, label: p.title }))} error={errors.publicationId?.message} {...form.register('publicationId')} />
        <TextField
          label="Number"
          type="number"
          min={1}
          hint={next !== null ? (next > 1 ? `The next after No. ${next - 1}.` : 'Its first edition.') : undefined}
          error={errors.number?.message}
          {...form.register('number')}
        />
        <TextField label="Date" type="date" error={errors.date?.message} {...form.register('date')} />
        <ErrorAlert error={create.error} title="Could not create the edition" />
        <Button type="submit" variant="primary" busy={create.isPending}>
          Create draft
        </Button>
      </form>
    </Card>
  );
}

/** /editions: a month calendar of editions and the list, with states as text badges. */
export function EditionsPage() {
  const [params, setParams] = useSearchParams();
  const month = /^\d{4}-\d{2}$/.test(params.get('month') ?? '') ? (params.get('month') as string) : thisMonth();
  const editions = useEditions({ month });
  const [y, m] = month.split('-').map(Number) as [number, number];
  const [showForm, setShowForm] = useState(false);
  return (
    <Page
      title="Editions"
      description="Dated editions of each publication: compose the slots, run the checks and send proofs to the printer."
      actions={
        <Button variant="primary" onClick={() => setShowForm((v) => !v)} aria-expanded={showForm}>
          New edition
        </Button>
      }
    >
      <PrintCaution />
      {showForm ? <NewEditionForm /> : null}
      <div className="flex items-center gap-2">
        <Button size="sm" onClick={() => setParams({ month: shiftMonth(month, -1) })}>
          ← Previous month
        </Button>
        <h2 className="min-w-40 text-center text-lg font-semibold" aria-live="polite">{`${MONTHS[m - 1]} ${y}`}</h2>
        <Button size="sm" onClick={() => setParams({ month: shiftMonth(month, 1) })}>
          Next month →
        </Button>
      </div>
      {editions.isPending ? (
        <Loading />
      ) : editions.error ? (
        <ErrorAlert error={editions.error} title="Could not load the editions" />
      ) : (
        <>
          <Calendar month={month} editions={editions.data} />
          {editions.data.length === 0 ? (
            <EmptyState title="No editions this month">Create one with “New edition”, or look at another month.</EmptyState>
          ) : (
            <FramedTable caption="Editions this month" headings={['Date', 'Edition', 'State', 'Slots', 'Latest proof']}>
              {editions.data.map((e) => (
                <tr key={e.id} className="border-t border-rule">
                  <td className="px-3 py-2 tabular-nums whitespace-nowrap">{formatDate(e.date)}</td>
                  <td className="px-3 py-2">
                    <Link to={`/editions/${e.id}`}>{`${e.publicationTitle} No. ${e.number}`}</Link>
                  </td>
                  <td className="px-3 py-2">
                    <EditionStateBadge state={e.state} />
                  </td>
                  <td className="px-3 py-2 tabular-nums">{e.slotCount}</td>
                  <td className="px-3 py-2">{e.latestProofVersion ? `v${e.latestProofVersion} (${e.latestProofStatus ?? ''})` : '—'}</td>
                </tr>
              ))}
            </FramedTable>
          )}
        </>
      )}
    </Page>
  );
}
