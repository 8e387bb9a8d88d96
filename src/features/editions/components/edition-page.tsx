import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { emptyRichText, type Edition, type RichTextDoc, type SlotInput } from '../../../../shared/contracts/editions';
import { useEdition } from '../../../api/editions';
import { usePuzzleList } from '../../../api/puzzles';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button, buttonClasses } from '../../../components/button';
import { PrintCaution } from '../../../components/caution-note';
import { Card, Loading, Page } from '../../../components/page';
import { PlainTable } from '../../../components/plain-table';
import { SelectField } from '../../../components/select-field';
import { StatusBadge } from '../../../components/status-badge';
import { TextField } from '../../../components/text-field';
import { errorMessage, isApiError } from '../../../lib/api-client';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useChecks } from '../api/get-checks';
import { usePublishEdition } from '../api/publish-edition';
import { useSendProof } from '../api/send-proof';
import { useUpdateEdition } from '../api/update-edition';
import { EditionStateBadge } from './edition-state-badge';
import { RichTextEditor } from './rich-text-editor';

function detailsList(error: unknown): string[] {
  if (!isApiError(error) || !Array.isArray(error.details)) return [];
  return error.details.map((d: { path?: string; message?: string }) => `${d.path ?? ''}: ${d.message ?? ''}`);
}

function ErrorBox({ title, error }: { title: string; error: unknown }) {
  if (!error) return null;
  const lines = detailsList(error);
  return (
    <Alert tone="danger" title={title}>
      <p>{errorMessage(error)}</p>
      {lines.length > 0 ? (
        <ul className="list-disc pl-5">
          {lines.map((l) => (
            <li key={l}>{l}</li>
          ))}
        </ul>
      ) : null}
    </Alert>
  );
}

/** The slot picker offers puzzles with a current certificate (the shared puzzle list, filtered). */
const printableSearch = { printable: true, pageSize: 200 };

function Slots({ edition }: { edition: Edition }) {
  const update = useUpdateEdition(edition.id);
  const editable = edition.state === 'draft';
  const [slots, setSlots] = useState<SlotInput[]>(() => edition.slots.map((s) => ({ puzzleId: s.puzzleId, instructions: s.instructions })));
  const [newId, setNewId] = useState('');
  const [open, setOpen] = useState<number | null>(null);
  const printable = usePuzzleList(printableSearch);
  const printableItems = printable.data?.items ?? [];
  const info = new Map(edition.slots.map((s) => [s.puzzleId, s.puzzle]));
  const move = (i: number, by: number) =>
    setSlots((list) => {
      const j = i + by;
      if (j < 0 || j >= list.length) return list;
      const next = [...list];
      [next[i], next[j]] = [next[j]!, next[i]!];
      return next;
    });
  return (
    <Card title="Slots">
      {slots.length === 0 ? <p className="text-sm text-ink-muted">No puzzles yet. Add one with a current certificate from the list below.</p> : null}
      <ol className="flex flex-col gap-2">
        {slots.map((s, i) => {
          const p = info.get(s.puzzleId);
          return (
            <li key={s.puzzleId} className="flex flex-col gap-2 rounded-md border border-rule p-2">
              <div className="flex flex-wrap items-center gap-2">
                <span className="font-semibold tabular-nums">{`Slot ${i + 1}`}</span>
                <span>{p ? `${p.title.startsWith(p.kind === 'assembly' ? 'Assembly' : 'Deduction') ? p.title : `${p.kind === 'assembly' ? 'Assembly' : 'Deduction'} · ${p.title} · ${p.size}`} · Grade ${p.grade}` : `Puzzle ${s.puzzleId}`}</span>
                {p ? <StatusBadge tone={p.certificateCurrent ? 'success' : 'danger'}>{p.certificateCurrent ? 'Certificate current' : 'Certificate out of date'}</StatusBadge> : null}
                {editable ? (
                  <span className="ml-auto flex gap-1">
                    <Button size="sm" aria-label={`Move slot ${i + 1} up`} disabled={i === 0} onClick={() => move(i, -1)}>
                      ↑
                    </Button>
                    <Button size="sm" aria-label={`Move slot ${i + 1} down`} disabled={i === slots.length - 1} onClick={() => move(i, 1)}>
                      ↓
                    </Button>
                    <Button size="sm" onClick={() => setOpen(open === i ? null : i)} aria-expanded={open === i}>
                      Instructions
                    </Button>
                    <Button size="sm" variant="danger" aria-label={`Remove slot ${i + 1}`} onClick={() => setSlots((l) => l.filter((_, k) => k !== i))}>
                      Remove
                    </Button>
                  </span>
                ) : null}
              </div>
              {open === i && editable ? (
                <RichTextEditor
                  label={`Instructions for slot ${i + 1}`}
                  value={s.instructions}
                  onChange={(doc) => setSlots((l) => l.map((x, k) => (k === i ? { ...x, instructions: doc } : x)))}
                />
              ) : null}
            </li>
          );
        })}
      </ol>
      {editable ? (
        <div className="flex flex-wrap items-end gap-2">
          {printableItems.length > 0 ? (
            <SelectField
              label="Puzzle"
              placeholder="Choose a puzzle…"
              value={newId}
              onChange={(e) => setNewId(e.target.value)}
              options={printableItems
                .filter((p) => !slots.some((s) => s.puzzleId === String(p.id)))
                .map((p) => ({
                  value: String(p.id),
                  label: `${p.kind === 'assembly' ? 'Assembly' : 'Deduction'} ${p.id}: ${p.title}${p.grade ? `, Grade ${p.grade}` : ''}${p.usedIn.length > 0 ? ` (used in ${p.usedIn.map((u) => `${u.publicationTitle} No. ${u.number}`).join(', ')})` : ' (unused)'}`,
                }))}
            />
          ) : (
            <TextField label="Puzzle id" value={newId} onChange={(e) => setNewId(e.target.value)} />
          )}
          <Button
            disabled={newId.trim() === '' || slots.some((s) => s.puzzleId === newId.trim())}
            onClick={() => {
              setSlots((l) => [...l, { puzzleId: newId.trim(), instructions: emptyRichText() }]);
              setNewId('');
            }}
          >
            Add slot
          </Button>
          <Button variant="primary" busy={update.isPending} onClick={() => update.mutate({ slots })}>
            Save slots
          </Button>
        </div>
      ) : null}
      <ErrorBox title="Could not save the slots" error={update.error} />
    </Card>
  );
}

function Introduction({ edition }: { edition: Edition }) {
  const update = useUpdateEdition(edition.id);
  const [doc, setDoc] = useState<RichTextDoc>(edition.introduction);
  const [number, setNumber] = useState(String(edition.number));
  const [date, setDate] = useState(edition.date);
  const editable = edition.state === 'draft';
  return (
    <Card title="Details and introduction">
      <div className="flex flex-wrap gap-3">
        <TextField label="Number" type="number" min={1} value={number} disabled={!editable} onChange={(e) => setNumber(e.target.value)} />
        <TextField label="Date" type="date" value={date} disabled={!editable} onChange={(e) => setDate(e.target.value)} />
      </div>
      <RichTextEditor label="Introduction" value={doc} onChange={setDoc} disabled={!editable} />
      {editable ? (
        <Button variant="primary" busy={update.isPending} onClick={() => update.mutate({ number: Number(number), date, introduction: doc })}>
          Save details
        </Button>
      ) : null}
      {update.isSuccess ? <Alert tone="success">Saved.</Alert> : null}
      <ErrorBox title="Could not save" error={update.error} />
    </Card>
  );
}

function Checks({ edition }: { edition: Edition }) {
  const checks = useChecks(edition.id);
  return (
    <Card title="Checks before proof">
      {checks.isPending ? (
        <Loading label="Running the checks (this renders a preview)…" />
      ) : checks.error ? (
        <ErrorAlert error={checks.error} />
      ) : (
        <>
          <ul className="flex flex-col gap-1 text-sm">
            {checks.data.checks.map((c, i) => (
              <li key={i} className="flex items-start gap-2">
                <StatusBadge tone={c.ok ? 'success' : 'danger'}>{c.ok ? 'Passed' : 'Failed'}</StatusBadge>
                <span>{c.message}</span>
              </li>
            ))}
          </ul>
          {checks.data.preflight ? (
            <div className="text-sm">
              <p className="font-semibold">Preflight</p>
              <p>{`${checks.data.preflight.pages} page(s); fonts embedded: ${checks.data.preflight.fontsEmbedded ? 'yes' : 'no'}; smallest square ${checks.data.preflight.smallestSquareMm ?? '—'} mm; smallest digit ${checks.data.preflight.smallestDigitPt ?? '—'} pt.`}</p>
              {checks.data.preflight.warnings.length > 0 ? (
                <ul className="list-disc pl-5 text-ink-soft">
                  {checks.data.preflight.warnings.map((w, i) => (
                    <li key={i}>{w.message}</li>
                  ))}
                </ul>
              ) : null}
            </div>
          ) : null}
        </>
      )}
      <Button size="sm" onClick={() => void checks.refetch()} busy={checks.isFetching}>
        Run the checks again
      </Button>
    </Card>
  );
}

function Proofs({ edition }: { edition: Edition }) {
  const latest = edition.proofs.at(-1);
  return (
    <Card title="Proof history">
      {edition.proofs.length === 0 ? (
        <p className="text-sm text-ink-muted">No proof sent yet.</p>
      ) : (
        <div className="overflow-x-auto">
          <PlainTable caption="Proofs of this edition" headings={['Version', 'Sent', 'Pages', 'State', 'Printer’s notes', 'File']} dense ruledHead={false}>
            {edition.proofs.map((p) => (
              <tr key={p.version} className="border-t border-rule">
                <td className="px-2 py-1 tabular-nums">{`v${p.version}`}</td>
                <td className="px-2 py-1 whitespace-nowrap">{`${formatDateTime(p.createdAt)}${p.createdByName ? ` by ${p.createdByName}` : ''}`}</td>
                <td className="px-2 py-1 tabular-nums">{p.pages}</td>
                <td className="px-2 py-1">
                  <StatusBadge tone={p.status === 'approved' ? 'success' : p.status === 'returned' ? 'warning' : 'neutral'}>{p.status[0]!.toUpperCase() + p.status.slice(1)}</StatusBadge>
                </td>
                <td className="px-2 py-1">{p.notes ?? '—'}</td>
                <td className="px-2 py-1">
                  <a href={`/api/editions/${edition.id}/proofs/${p.version}.pdf?download=1`}>{`Download v${p.version}`}</a>
                </td>
              </tr>
            ))}
          </PlainTable>
        </div>
      )}
      {edition.pressFile ? (
        <p className="text-sm">
          Press file (from v{edition.pressFile.version}, SHA-256 <code className="break-all">{edition.pressFile.sha256}</code>):{' '}
          <a href={`/api/editions/${edition.id}/press.pdf?download=1`}>Download press file</a>
        </p>
      ) : null}
      {latest ? <iframe title={`Proof v${latest.version}`} src={`/api/editions/${edition.id}/proofs/${latest.version}.pdf`} className="h-[36rem] w-full rounded border border-rule" /> : null}
    </Card>
  );
}

/** /editions/:id: the composer (slots, introduction, instructions, checks, preview) and the proof history. */
export function EditionPage() {
  const { id = '' } = useParams();
  const edition = useEdition(id);
  const send = useSendProof(id);
  const publish = usePublishEdition(id);
  if (edition.isPending) return <Loading />;
  if (edition.error) return <ErrorAlert error={edition.error} title="Could not load the edition" />;
  const e = edition.data;
  return (
    <Page
      title={`${e.publicationTitle} No. ${e.number}`}
      description={`${formatDate(e.date)} · template ${e.templateId}`}
      actions={
        <>
          <EditionStateBadge state={e.state} />
          <a className={buttonClasses('secondary', 'md')} href={`/api/editions/${e.id}/preview.pdf`} target="_blank" rel="noreferrer">
            Preview PDF
          </a>
          {e.state === 'draft' ? (
            <Button variant="primary" busy={send.isPending} onClick={() => send.mutate()}>
              Send to proof
            </Button>
          ) : null}
          {e.state === 'approved' ? (
            <Button variant="primary" busy={publish.isPending} onClick={() => publish.mutate()}>
              Mark published
            </Button>
          ) : null}
        </>
      }
    >
      <PrintCaution />
      {e.state === 'draft' && e.returnNotes ? (
        <Alert tone="warning" title="The printer returned the last proof">
          {e.returnNotes}
        </Alert>
      ) : null}
      {e.state === 'in_proof' ? <Alert tone="info">{`Proof v${e.proofs.at(-1)?.version ?? ''} is with the printer. The edition is locked until it is approved or returned.`}</Alert> : null}
      {send.isSuccess ? <Alert tone="success">{`Proof v${send.data.proofs.at(-1)?.version ?? ''} sent; the printers have been mailed.`}</Alert> : null}
      <ErrorBox title="Could not send to proof" error={send.error} />
      <ErrorBox title="Could not publish" error={publish.error} />
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="flex flex-col gap-6">
          <Introduction key={`${e.id}-${e.state}`} edition={e} />
          <Slots key={`${e.id}-${e.state}-${e.slots.map((s) => s.puzzleId).join(',')}`} edition={e} />
        </div>
        {e.state === 'draft' ? (
          <div className="flex flex-col gap-6">
            <Checks edition={e} />
          </div>
        ) : null}
      </div>
      <Proofs edition={e} />
    </Page>
  );
}
