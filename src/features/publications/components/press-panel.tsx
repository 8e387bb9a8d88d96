import { useState, type FormEvent } from 'react';
import { outputConditions, pressSpecInputSchema, pressStandardInfo, pressStandards, type PressSpecInput, type PressSpecResponse } from '../../../../shared/contracts/press';
import type { Publication } from '../../../../shared/contracts/publications';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { CheckboxField } from '../../../components/checkbox-field';
import { Card, Loading } from '../../../components/page';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { usePressSpec, usePrinterChoices, useSavePressSpec, useSavePrinters, useUploadOutputProfile } from '../api/press-and-printers';

// The press spec and the printers of one publication (admins): what the plant accepts, and
// who may see, download and decide this publication's proofs.

type Draft = { standard: string; condition: string; bleedMm: string; minTypePt: string; minLinePt: string };

const draftOf = (s: PressSpecInput): Draft => ({
  standard: s.standard ?? '',
  condition: s.condition ?? '',
  bleedMm: s.bleedMm === null ? '' : String(s.bleedMm),
  minTypePt: s.minTypePt === null ? '' : String(s.minTypePt),
  minLinePt: s.minLinePt === null ? '' : String(s.minLinePt),
});

const numberOrNull = (v: string) => (v.trim() === '' ? null : Number(v));

function PressSpecForm({ publicationId, data }: { publicationId: string; data: PressSpecResponse }) {
  const save = useSavePressSpec(publicationId);
  const upload = useUploadOutputProfile(publicationId);
  const [draft, setDraft] = useState<Draft>(() => draftOf(data.spec));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const d = data.templateDefaults;
  const set = (k: keyof Draft) => (e: { target: { value: string } }) => setDraft({ ...draft, [k]: e.target.value });
  const submit = async (e: FormEvent) => {
    e.preventDefault();
    const parsed = pressSpecInputSchema.safeParse({
      standard: draft.standard === '' ? null : draft.standard,
      condition: draft.condition === '' ? null : draft.condition,
      bleedMm: numberOrNull(draft.bleedMm),
      minTypePt: numberOrNull(draft.minTypePt),
      minLinePt: numberOrNull(draft.minLinePt),
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
      return;
    }
    setErrors({});
    await save.mutateAsync(parsed.data).catch(() => null);
  };
  const e = data.effective;
  return (
    <form noValidate onSubmit={submit} className="grid gap-3 md:grid-cols-2">
      <p className="text-sm text-ink-muted md:col-span-2">
        {`In force: ${pressStandardInfo[e.standard].gtsVersion}, ${e.condition}, bleed ${e.bleedMm} mm, type from ${e.minTypePt} pt, lines from ${e.minLinePt} pt. Leave a field empty to take the template's value.`}
      </p>
      <SelectField
        label="PDF/X standard"
        value={draft.standard}
        onChange={set('standard')}
        options={[{ value: '', label: `Template default (${pressStandardInfo[d.standard].gtsVersion})` }, ...pressStandards.map((s) => ({ value: s, label: pressStandardInfo[s].label }))]}
        error={errors.standard}
      />
      <SelectField
        label="Output condition"
        hint="The characterized printing condition the plant prints to (registered at color.org)."
        value={draft.condition}
        onChange={set('condition')}
        options={[{ value: '', label: `Template default (${d.condition})` }, ...Object.entries(outputConditions).map(([id, text]) => ({ value: id, label: `${id}: ${text.replace(/, [^,]+$/, '')}` }))]}
        error={errors.condition}
      />
      <TextField label="Bleed (mm)" inputMode="decimal" placeholder={`${d.bleedMm} (template)`} value={draft.bleedMm} onChange={set('bleedMm')} error={errors.bleedMm} />
      <TextField label="Smallest type (pt)" inputMode="decimal" placeholder={`${d.minTypePt} (template)`} value={draft.minTypePt} onChange={set('minTypePt')} error={errors.minTypePt} />
      <TextField
        label="Thinnest line (pt)"
        inputMode="decimal"
        hint="Hairlines under 0.25 pt may not print (common practice)."
        placeholder={`${d.minLinePt} (template)`}
        value={draft.minLinePt}
        onChange={set('minLinePt')}
        error={errors.minLinePt}
      />
      <div className="flex flex-col gap-1">
        <label className="text-sm font-medium text-ink" htmlFor={`icc-${publicationId}`}>
          Plant's ICC output profile (needed for PDF/X-4)
        </label>
        <input
          id={`icc-${publicationId}`}
          type="file"
          accept=".icc,.icm"
          className="text-sm"
          onChange={(ev) => {
            const f = ev.target.files?.[0];
            if (f) upload.mutate(f);
          }}
        />
        <span className="text-sm text-ink-muted">{data.profile ? `${data.profile.description} (${Math.round(data.profile.bytes / 1024)} kB)` : 'None uploaded.'}</span>
      </div>
      <div className="flex items-end gap-2 md:col-span-2">
        <Button type="submit" variant="primary" busy={save.isPending}>
          Save press spec
        </Button>
      </div>
      <ErrorAlert error={save.error} title="Could not save the press spec" className="md:col-span-2" />
      <ErrorAlert error={upload.error} title="Could not take the profile" className="md:col-span-2" />
      {save.isSuccess ? (
        <Alert tone="success" className="md:col-span-2">
          Saved. The next proof is made to this spec; check every proof before it goes to press.
        </Alert>
      ) : null}
    </form>
  );
}

function PrintersForm({ publicationId }: { publicationId: string }) {
  const choices = usePrinterChoices(publicationId);
  const save = useSavePrinters(publicationId);
  const [picked, setPicked] = useState<Set<string> | null>(null);
  if (choices.isPending) return <Loading />;
  if (choices.error) return <ErrorAlert error={choices.error} />;
  const chosen = picked ?? new Set(choices.data.items.map((p) => p.id));
  if (choices.data.candidates.length === 0) return <p className="text-sm text-ink-muted">No printer accounts yet: invite a printer on the Users page first.</p>;
  return (
    <form
      className="flex flex-col gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate([...chosen]);
      }}
    >
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 text-sm text-ink-muted">They alone see, download and decide this publication's proofs, and get its proof mail.</legend>
        {choices.data.candidates.map((p) => (
          <CheckboxField
            key={p.id}
            label={`${p.name} (${p.email})`}
            checked={chosen.has(p.id)}
            onChange={(e) => {
              const next = new Set(chosen);
              if (e.target.checked) next.add(p.id);
              else next.delete(p.id);
              setPicked(next);
            }}
          />
        ))}
      </fieldset>
      <div>
        <Button type="submit" busy={save.isPending}>
          Save printers
        </Button>
      </div>
      <ErrorAlert error={save.error} title="Could not save the printers" />
      {save.isSuccess ? <Alert tone="success">Printers saved.</Alert> : null}
    </form>
  );
}

/** The press spec and printers of one publication. */
export function PressPanel({ publication, onDone }: { publication: Publication; onDone: () => void }) {
  const spec = usePressSpec(publication.id);
  return (
    <Card title={`Press and printers: ${publication.title}`}>
      <h3 className="text-sm font-semibold text-ink">Press spec</h3>
      {spec.isPending ? <Loading /> : spec.error ? <ErrorAlert error={spec.error} /> : <PressSpecForm publicationId={publication.id} data={spec.data} />}
      <h3 className="mt-2 text-sm font-semibold text-ink">Printers</h3>
      <PrintersForm publicationId={publication.id} />
      <div>
        <Button onClick={onDone}>Close</Button>
      </div>
    </Card>
  );
}
