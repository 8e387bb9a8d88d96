import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { cadences, formatFee, publicationInputSchema, type Publication } from '../../../../shared/contracts/publications';
import { usePublications } from '../../../api/publications';
import { useTemplates } from '../../../api/templates';
import { ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TaxCaution } from '../../../components/caution-note';
import { EmptyState } from '../../../components/empty-state';
import { FramedTable } from '../../../components/framed-table';
import { Card, Loading, Page } from '../../../components/page';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { useSavePublication } from '../api/save-publication';
import { PressPanel } from './press-panel';

// The form edits fees as decimals ("45.00") and sends whole minor units (4500).
const money = z
  .string()
  .trim()
  .regex(/^\d{1,7}(\.\d{1,2})?$/, 'a fee like 45 or 45.50')
  .transform((v) => Math.round(Number(v) * 100));

const formSchema = publicationInputSchema.omit({ feeAssemblyMinor: true, feeDeductionMinor: true, reuseWindowDays: true }).extend({
  reuseWindowDays: z.coerce.number({ error: 'reuse window must be a number of days' }).int('whole days').min(0, 'must not be negative').max(3650, 'at most 3650 days'),
  feeAssembly: money,
  feeDeduction: money,
});
type FormIn = z.input<typeof formSchema>;
type FormOut = z.output<typeof formSchema>;

const blank: FormIn = { title: '', publisher: 'Larkspur & Quill Press', templateId: 'a4', cadence: 'weekly', solutionRule: 'same_edition', reuseWindowDays: 180, currency: 'GBP', feeAssembly: '40.00', feeDeduction: '55.00' };

function toForm(p: Publication): FormIn {
  return { title: p.title, publisher: p.publisher, templateId: p.templateId, cadence: p.cadence, solutionRule: p.solutionRule, reuseWindowDays: p.reuseWindowDays, currency: p.currency, feeAssembly: (p.feeAssemblyMinor / 100).toFixed(2), feeDeduction: (p.feeDeductionMinor / 100).toFixed(2) };
}

function PublicationForm({ editing, onDone }: { editing: Publication | null; onDone: () => void }) {
  const templates = useTemplates();
  const save = useSavePublication();
  const form = useForm<FormIn, unknown, FormOut>({ resolver: zodResolver(formSchema), defaultValues: editing ? toForm(editing) : blank });
  const { errors } = form.formState;
  return (
    <Card title={editing ? `Edit ${editing.title}` : 'New publication'}>
      <form
        noValidate
        className="grid gap-3 md:grid-cols-2"
        onSubmit={form.handleSubmit(async (v) => {
          const { feeAssembly, feeDeduction, ...rest } = v;
          const ok = await save.mutateAsync({ input: { ...rest, feeAssemblyMinor: feeAssembly, feeDeductionMinor: feeDeduction }, ...(editing ? { id: editing.id } : {}) }).catch(() => null);
          if (ok) onDone();
        })}
      >
        <TextField label="Title" error={errors.title?.message} {...form.register('title')} />
        <TextField label="Publisher" error={errors.publisher?.message} {...form.register('publisher')} />
        <SelectField label="Page template" options={(templates.data ?? []).map((t) => ({ value: t.template.id, label: t.template.name }))} error={errors.templateId?.message} {...form.register('templateId')} />
        <SelectField label="Cadence" options={cadences.map((c) => ({ value: c, label: c[0]!.toUpperCase() + c.slice(1) }))} error={errors.cadence?.message} {...form.register('cadence')} />
        <SelectField
          label="Solutions"
          options={[
            { value: 'same_edition', label: 'In the same edition' },
            { value: 'next_edition', label: 'In the next edition' },
          ]}
          error={errors.solutionRule?.message}
          {...form.register('solutionRule')}
        />
        <TextField label="Reuse window (days)" type="number" min={0} hint="A tiling may not appear twice in this publication within this many days." error={errors.reuseWindowDays?.message} {...form.register('reuseWindowDays')} />
        <TextField label="Currency" hint="ISO 4217, e.g. GBP" error={errors.currency?.message} {...form.register('currency')} />
        <TextField label="Fee per Assembly puzzle" inputMode="decimal" error={errors.feeAssembly?.message} {...form.register('feeAssembly')} />
        <TextField label="Fee per Deduction puzzle" inputMode="decimal" error={errors.feeDeduction?.message} {...form.register('feeDeduction')} />
        <div className="flex items-end gap-2 md:col-span-2">
          <Button type="submit" variant="primary" busy={save.isPending}>
            {editing ? 'Save changes' : 'Create publication'}
          </Button>
          <Button onClick={onDone}>Cancel</Button>
        </div>
        <ErrorAlert error={save.error} title="Could not save" className="md:col-span-2" />
      </form>
    </Card>
  );
}

/** /admin/publications: titles with template, cadence, solution rule, reuse window and fees. */
export function PublicationsPage() {
  const list = usePublications();
  const [editing, setEditing] = useState<Publication | 'new' | null>(null);
  const [press, setPress] = useState<Publication | null>(null);
  return (
    <Page
      title="Publications"
      description="Each publication has a page template, a cadence, a rule for where solutions go, a reuse window, a fee per puzzle kind, a press spec and its printers."
      actions={
        <Button variant="primary" onClick={() => setEditing('new')}>
          New publication
        </Button>
      }
    >
      <TaxCaution />
      {editing ? <PublicationForm key={editing === 'new' ? 'new' : editing.id} editing={editing === 'new' ? null : editing} onDone={() => setEditing(null)} /> : null}
      {press ? <PressPanel key={press.id} publication={press} onDone={() => setPress(null)} /> : null}
      {list.isPending ? (
        <Loading />
      ) : list.error ? (
        <ErrorAlert error={list.error} />
      ) : list.data.length === 0 ? (
        <EmptyState title="No publications yet" />
      ) : (
        <FramedTable caption="Publications" headings={['Title', 'Template', 'Cadence', 'Solutions', 'Reuse window', 'Fees (Assembly / Deduction)', 'Printers', '']}>
          {list.data.map((p) => (
            <tr key={p.id} className="border-t border-rule">
              <td className="px-3 py-2">
                <span className="font-semibold">{p.title}</span>
                <br />
                <span className="text-ink-muted">{p.publisher}</span>
              </td>
              <td className="px-3 py-2">{p.templateId}</td>
              <td className="px-3 py-2">{p.cadence}</td>
              <td className="px-3 py-2">{p.solutionRule === 'same_edition' ? 'Same edition' : 'Next edition'}</td>
              <td className="px-3 py-2 tabular-nums">{`${p.reuseWindowDays} days`}</td>
              <td className="px-3 py-2 tabular-nums">{`${formatFee(p.feeAssemblyMinor, p.currency)} / ${formatFee(p.feeDeductionMinor, p.currency)}`}</td>
              <td className="px-3 py-2">{p.printers.length > 0 ? p.printers.map((x) => x.name).join(', ') : <span className="text-ink-muted">None: nobody gets its proofs</span>}</td>
              <td className="px-3 py-2">
                <div className="flex gap-2">
                  <Button size="sm" onClick={() => setEditing(p)} aria-label={`Edit ${p.title}`}>
                    Edit
                  </Button>
                  <Button size="sm" onClick={() => setPress(p)} aria-label={`Press and printers of ${p.title}`}>
                    Press and printers
                  </Button>
                </div>
              </td>
            </tr>
          ))}
        </FramedTable>
      )}
    </Page>
  );
}
