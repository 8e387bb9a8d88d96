import { useEffect, useState } from 'react';
import { useBlocker, useParams } from 'react-router-dom';
import { emptyRichText, overrideKindLabels, type Edition, type EditionChecks, type RichTextDoc, type SlotInput } from '../../../../shared/contracts/editions';
import { formatMoney } from '../../../../shared/contracts/ledger';
import { useEdition } from '../../../api/editions';
import { useMe } from '../../../api/session';
import { ConfirmDialog } from '../../../components/confirm-dialog';
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
import { usePublishCheck, usePublishEdition } from '../api/publish-edition';
import { useSendProof } from '../api/send-proof';
import { useUpdateEdition } from '../api/update-edition';
import { EditionStateBadge } from './edition-state-badge';
import { PagePreview } from './page-preview';
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

/** The composer's working copy of a draft: what "Save changes" sends in one PATCH. */
type DraftForm = { number: string; date: string; introduction: RichTextDoc; slots: SlotInput[] };

function formOf(e: Edition): DraftForm {
  return { number: String(e.number), date: e.date, introduction: e.introduction, slots: e.slots.map((s) => ({ puzzleId: s.puzzleId, instructions: s.instructions })) };
}

const sameForm = (a: DraftForm, b: DraftForm) => JSON.stringify(a) === JSON.stringify(b);

function Slots({ edition, slots, setSlots }: { edition: Edition; slots: SlotInput[]; setSlots: (update: (list: SlotInput[]) => SlotInput[]) => void }) {
  const editable = edition.state === 'draft';
  const [newId, setNewId] = useState('');
  const [open, setOpen] = useState<number | null>(null);
  const [dragging, setDragging] = useState<number | null>(null);
  const [announce, setAnnounce] = useState('');
  const printable = usePuzzleList(printableSearch);
  const printableItems = printable.data?.items ?? [];
  const info = new Map(edition.slots.map((s) => [s.puzzleId, s.puzzle]));
  const titleOf = (id: string) => {
    const p = info.get(id) ?? null;
    if (p) return p.title;
    const listed = printableItems.find((x) => String(x.id) === id);
    return listed ? listed.title : `Puzzle ${id}`;
  };
  const moveTo = (from: number, to: number) =>
    setSlots((list) => {
      if (to < 0 || to >= list.length || from === to) return list;
      const next = [...list];
      const [item] = next.splice(from, 1);
      next.splice(to, 0, item!);
      setAnnounce(`${titleOf(item!.puzzleId)} moved to slot ${to + 1} of ${list.length}.`);
      return next;
    });
  return (
    <Card title="Slots">
      {slots.length === 0 ? <p className="text-sm text-ink-muted">No puzzles yet. Add one with a current certificate from the list below.</p> : null}
      {editable && slots.length > 1 ? <p className="text-sm text-ink-muted">Drag a slot by its handle to reorder, or use its Up and Down buttons.</p> : null}
      <p className="sr-only" aria-live="polite">
        {announce}
      </p>
      <ol className="flex flex-col gap-2">
        {slots.map((s, i) => {
          const p = info.get(s.puzzleId);
          return (
            <li
              key={s.puzzleId}
              className={`flex flex-col gap-2 rounded-md border p-2 ${dragging === i ? 'border-accent bg-paper-deep' : 'border-rule'}`}
              onDragOver={(e) => {
                if (dragging === null) return;
                e.preventDefault();
                e.dataTransfer.dropEffect = 'move';
              }}
              onDrop={(e) => {
                e.preventDefault();
                if (dragging !== null) moveTo(dragging, i);
                setDragging(null);
              }}
            >
              <div className="flex flex-wrap items-center gap-2">
                {editable ? (
                  <span
                    draggable
                    onDragStart={(e) => {
                      setDragging(i);
                      e.dataTransfer.effectAllowed = 'move';
                      e.dataTransfer.setData('text/plain', s.puzzleId);
                    }}
                    onDragEnd={() => setDragging(null)}
                    className="cursor-grab select-none px-1 text-ink-muted"
                    title="Drag to reorder"
                    aria-hidden
                  >
                    ⠿
                  </span>
                ) : null}
                <span className="font-semibold tabular-nums">{`Slot ${i + 1}`}</span>
                <span>{p ? `${p.title.startsWith(p.kind === 'assembly' ? 'Assembly' : 'Deduction') ? p.title : `${p.kind === 'assembly' ? 'Assembly' : 'Deduction'} · ${p.title} · ${p.size}`} · Grade ${p.grade}` : `${titleOf(s.puzzleId)} (not saved yet)`}</span>
                {p ? <StatusBadge tone={p.certificateCurrent ? 'success' : 'danger'}>{p.certificateCurrent ? 'Certificate current' : 'Certificate out of date'}</StatusBadge> : null}
                {editable ? (
                  <span className="ml-auto flex gap-1">
                    <Button size="sm" aria-label={`Move slot ${i + 1} up`} disabled={i === 0} onClick={() => moveTo(i, i - 1)}>
                      ↑ Up
                    </Button>
                    <Button size="sm" aria-label={`Move slot ${i + 1} down`} disabled={i === slots.length - 1} onClick={() => moveTo(i, i + 1)}>
                      ↓ Down
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
        </div>
      ) : null}
    </Card>
  );
}

function Introduction({ edition, form, setForm }: { edition: Edition; form: DraftForm; setForm: (update: (f: DraftForm) => DraftForm) => void }) {
  const editable = edition.state === 'draft';
  return (
    <Card title="Details and introduction">
      <div className="flex flex-wrap gap-3">
        <TextField label="Number" type="number" min={1} value={form.number} disabled={!editable} onChange={(e) => setForm((f) => ({ ...f, number: e.target.value }))} />
        <TextField label="Date" type="date" value={form.date} disabled={!editable} onChange={(e) => setForm((f) => ({ ...f, date: e.target.value }))} />
      </div>
      <RichTextEditor label="Introduction" value={form.introduction} onChange={(doc) => setForm((f) => ({ ...f, introduction: doc }))} disabled={!editable} />
    </Card>
  );
}

function Checks({ edition, checks }: { edition: Edition; checks: ReturnType<typeof useChecks> }) {
  return (
    <Card title="Checks before proof">
      <p className="text-sm text-ink-muted">{`Checks of No. ${edition.number} as last saved.`}</p>
      {checks.isPending ? (
        <Loading label="Running the checks (this renders a preview)…" />
      ) : checks.error ? (
        <ErrorAlert error={checks.error} />
      ) : (
        <>
          <ul className="flex flex-col gap-1 text-sm">
            {checks.data.checks.map((c, i) => (
              <li key={i} className="flex items-start gap-2">
                <StatusBadge tone={c.ok ? 'success' : c.overridable ? 'warning' : 'danger'}>{c.ok ? 'Passed' : c.overridable ? 'Failed (can be overridden)' : 'Failed'}</StatusBadge>
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
                    <li key={i}>{`${w.code.startsWith('error:') ? 'Error' : 'Warning'}: ${w.message}`}</li>
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

/** Guards someone went past with a reason (never changed). */
function Overrides({ edition }: { edition: Edition }) {
  if (edition.overrides.length === 0) return null;
  return (
    <Card title="Guards passed with a reason">
      <ul className="flex flex-col gap-2 text-sm">
        {edition.overrides.map((o, i) => (
          <li key={i}>
            <p className="font-semibold">{`${overrideKindLabels[o.kind]}${o.proofVersion ? ` (proof v${o.proofVersion})` : ''}, ${formatDateTime(o.at)}${o.byName ? ` by ${o.byName}` : ''}`}</p>
            <p>{`Reason: ${o.reason}`}</p>
            <p className="text-ink-muted">{`The guard said: ${o.refused}`}</p>
          </li>
        ))}
      </ul>
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
                  <a className="underline" href={`/api/editions/${edition.id}/proofs/${p.version}.pdf?download=1`}>{`Download v${p.version}`}</a>
                </td>
              </tr>
            ))}
          </PlainTable>
        </div>
      )}
      {edition.pressFile ? (
        <p className="text-sm">
          Press file (from v{edition.pressFile.version}, SHA-256 <code className="break-all">{edition.pressFile.sha256}</code>):{' '}
          <a className="underline" href={`/api/editions/${edition.id}/press.pdf?download=1`}>
            Download press file
          </a>
        </p>
      ) : null}
      {latest ? <iframe title={`Proof v${latest.version}`} src={`/api/editions/${edition.id}/proofs/${latest.version}.pdf`} className="h-[36rem] w-full rounded border border-rule" /> : null}
    </Card>
  );
}

function failedChecks(c: EditionChecks | undefined) {
  const failed = c?.checks.filter((x) => !x.ok) ?? [];
  return { hard: failed.filter((x) => !x.overridable), soft: failed.filter((x) => x.overridable) };
}

/** Send to proof, after saying what will happen; preflight floor errors need a reason. */
function SendDialog({ edition, checks, open, onClose }: { edition: Edition; checks: EditionChecks | undefined; open: boolean; onClose: () => void }) {
  const send = useSendProof(edition.id);
  const { hard, soft } = failedChecks(checks);
  const version = (edition.proofs.at(-1)?.version ?? 0) + 1;
  return (
    <ConfirmDialog
      open={open}
      title={`Send No. ${edition.number} to proof?`}
      confirmLabel={soft.length > 0 ? `Send proof v${version} anyway` : `Send proof v${version}`}
      busy={send.isPending}
      error={send.error}
      reasonLabel={soft.length > 0 && hard.length === 0 ? 'Why send it past the preflight’s errors?' : undefined}
      blockedBecause={!checks ? 'The checks have not finished yet.' : hard.length > 0 ? `Fix the failed checks first: ${hard.map((c) => c.message).join(' ')}` : undefined}
      onCancel={() => {
        send.reset();
        onClose();
      }}
      onConfirm={(reason) => send.mutate({ updatedAt: edition.updatedAt, ...(reason ? { override: { reason } } : {}) }, { onSuccess: onClose })}
    >
      <p>{`Proof v${version} is made from the edition as saved (${edition.slots.length} puzzle(s)), stamped PROOF, stored with its SHA-256, and mailed to the printers of ${edition.publicationTitle}.`}</p>
      <p>The edition is then locked until the printer approves or returns the proof.</p>
      {soft.length > 0 ? (
        <Alert tone="warning" title="The preflight found errors">
          <ul className="list-disc pl-5">
            {soft.map((c, i) => (
              <li key={i}>{c.message}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
    </ConfirmDialog>
  );
}

/** Mark published, after saying the date and the fees it makes payable; before the date or out of order only an admin, with a reason. */
function PublishDialog({ edition, open, onClose }: { edition: Edition; open: boolean; onClose: () => void }) {
  const publish = usePublishEdition(edition.id);
  const check = usePublishCheck(edition.id, open);
  const me = useMe();
  const isAdmin = me.data?.role === 'admin';
  const c = check.data;
  const blocked = c ? c.blockers.length > 0 : false;
  return (
    <ConfirmDialog
      open={open}
      title={`Publish No. ${edition.number}?`}
      confirmLabel={blocked ? `Publish No. ${edition.number} anyway` : `Publish No. ${edition.number}`}
      busy={publish.isPending}
      error={publish.error ?? check.error}
      reasonLabel={blocked && isAdmin ? 'Why publish it now?' : undefined}
      blockedBecause={!c ? 'Working out what publishing would do…' : blocked && !isAdmin ? 'Only an admin may publish it now, with a reason.' : undefined}
      onCancel={() => {
        publish.reset();
        onClose();
      }}
      onConfirm={(reason) => publish.mutate(reason ? { override: { reason } } : {}, { onSuccess: onClose })}
    >
      {c ? (
        <>
          <p>{`${edition.publicationTitle} No. ${edition.number} is dated ${formatDate(c.date)}; today is ${formatDate(c.today)}.`}</p>
          <p>
            {c.fees.entries.length > 0
              ? `Publishing makes ${formatMoney(c.fees.totalMinor, c.fees.currency)} in fees payable at once: ${c.fees.entries.map((e) => `${formatMoney(e.amountMinor, c.fees.currency)} to ${e.setterName ?? 'a setter'} for slot ${e.slot}`).join('; ')}.`
              : 'No fee becomes payable: no puzzle in it has a setter.'}
          </p>
          <p>It cannot be undone.</p>
          {blocked ? (
            <Alert tone="warning" title="Not yet">
              <ul className="list-disc pl-5">
                {c.blockers.map((b) => (
                  <li key={b.code}>{b.message}</li>
                ))}
              </ul>
            </Alert>
          ) : null}
        </>
      ) : check.isPending ? (
        <Loading />
      ) : null}
    </ConfirmDialog>
  );
}

/** The composer of a draft: one working copy of details, introduction and slots, saved in one go; leaving with unsaved changes asks first. */
function Composer({ edition: e, update }: { edition: Edition; update: ReturnType<typeof useUpdateEdition> }) {
  const [form, setForm] = useState<DraftForm>(() => formOf(e));
  const dirty = e.state === 'draft' && !sameForm(form, formOf(e));
  const checks = useChecks(e.id);
  const [sending, setSending] = useState(false);
  const [publishing, setPublishing] = useState(false);
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && currentLocation.pathname !== nextLocation.pathname);
  useEffect(() => {
    if (!dirty) return;
    const warn = (ev: BeforeUnloadEvent) => {
      ev.preventDefault();
      ev.returnValue = '';
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty]);
  const save = () => update.mutate({ number: Number(form.number), date: form.date, introduction: form.introduction, slots: form.slots });
  const { hard } = failedChecks(checks.data);
  const sendBlocked = dirty ? 'Save your changes first: a proof is made from the saved edition.' : hard.length > 0 ? 'Fix the failed checks first.' : null;
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
          {e.slots.length > 0 ? (
            <a className={buttonClasses('secondary', 'md')} href={`/api/editions/${e.id}/layout-package.zip`} download title="Every slot's puzzle and solution as PDF/X and SVG, with texts and a manifest, for your own page layout">
              Package for layout
            </a>
          ) : null}
          {e.state === 'draft' ? (
            <Button variant="primary" disabled={sendBlocked !== null || checks.isPending} title={sendBlocked ?? undefined} aria-describedby={sendBlocked ? 'send-blocked' : undefined} onClick={() => setSending(true)}>
              Send to proof
            </Button>
          ) : null}
          {e.state === 'approved' ? (
            <Button variant="primary" onClick={() => setPublishing(true)}>
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
      {e.state === 'draft' && sendBlocked ? (
        <p id="send-blocked" className="text-sm font-medium text-warning">
          {sendBlocked}
        </p>
      ) : null}
      {dirty ? (
        <div role="region" aria-label="Unsaved changes" className="sticky top-0 z-10 flex flex-wrap items-center gap-3 rounded-md border border-warning/60 bg-warning-soft p-3">
          <p className="text-sm font-semibold">You have unsaved changes. They are not in the checks, the preview or a proof until you save them.</p>
          <span className="ml-auto flex gap-2">
            <Button onClick={() => setForm(formOf(e))}>Discard changes</Button>
            <Button variant="primary" busy={update.isPending} onClick={save}>
              Save changes
            </Button>
          </span>
        </div>
      ) : null}
      {update.isSuccess && !dirty ? <Alert tone="success">Saved.</Alert> : null}
      <ErrorBox title="Could not save" error={update.error} />
      <div className="grid gap-6 lg:grid-cols-2">
        <div className="flex flex-col gap-6">
          <Introduction edition={e} form={form} setForm={setForm} />
          <Slots edition={e} slots={form.slots} setSlots={(f) => setForm((x) => ({ ...x, slots: f(x.slots) }))} />
        </div>
        {e.state === 'draft' ? (
          <div className="flex flex-col gap-6">
            <Checks edition={e} checks={checks} />
            <PagePreview editionId={e.id} updatedAt={e.updatedAt} />
          </div>
        ) : null}
      </div>
      <Overrides edition={e} />
      <Proofs edition={e} />
      <SendDialog edition={e} checks={checks.data} open={sending} onClose={() => setSending(false)} />
      {e.state === 'approved' ? <PublishDialog edition={e} open={publishing} onClose={() => setPublishing(false)} /> : null}
      <ConfirmDialog
        open={blocker.state === 'blocked'}
        title="Leave without saving?"
        confirmLabel="Leave and lose the changes"
        confirmVariant="danger"
        onCancel={() => blocker.reset?.()}
        onConfirm={() => blocker.proceed?.()}
      >
        <p>{`Your changes to No. ${e.number} (details, introduction or slots) are not saved. They are lost if you leave.`}</p>
      </ConfirmDialog>
    </Page>
  );
}

/** /editions/:id: the composer (slots, introduction, instructions, checks, preview) and the proof history. */
export function EditionPage() {
  const { id = '' } = useParams();
  const edition = useEdition(id);
  const update = useUpdateEdition(id);
  if (edition.isPending) return <Loading />;
  if (edition.error) return <ErrorAlert error={edition.error} title="Could not load the edition" />;
  // a new saved state (after a save, a send or a change elsewhere) starts a fresh working copy
  return <Composer key={`${edition.data.id}-${edition.data.state}-${edition.data.updatedAt}`} edition={edition.data} update={update} />;
}
