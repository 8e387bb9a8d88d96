import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { returnProofSchema } from '../../../../shared/contracts/editions';
import { usePrinterEdition } from '../../../api/editions';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button, buttonClasses } from '../../../components/button';
import { PrintCaution } from '../../../components/caution-note';
import { Card, Loading, Page } from '../../../components/page';
import { StatusBadge } from '../../../components/status-badge';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useApproveProof, useReturnProof } from '../api/decide-proof';
import { PreflightPages } from './preflight-pages';
import { ConfirmDialog } from '../../../components/confirm-dialog';

/** /proofs/:id (printer): the proof, its preflight, approve or return with notes. */
export function ProofPage() {
  const { id = '' } = useParams();
  const edition = usePrinterEdition(id);
  const approve = useApproveProof(id);
  const ret = useReturnProof(id);
  const [notes, setNotes] = useState('');
  const [notesError, setNotesError] = useState<string | undefined>();
  const [approving, setApproving] = useState(false);
  if (edition.isPending) return <Loading />;
  if (edition.error) return <ErrorAlert error={edition.error} />;
  const e = edition.data;
  const latest = e.proofs.at(-1);
  const pending = latest && latest.status === 'pending' && e.state === 'in_proof' ? latest : null;
  return (
    <Page title={`${e.publicationTitle} No. ${e.number}`} description={`${formatDate(e.date)} · template ${e.templateId}`}>
      <PrintCaution />
      {approve.isSuccess ? <Alert tone="success">Approved. The press file is ready under Press files; the desk has been mailed.</Alert> : null}
      {ret.isSuccess ? <Alert tone="success">Returned to the desk with your notes.</Alert> : null}
      <ErrorAlert error={approve.error} title="Could not approve" />
      <ErrorAlert error={ret.error} title="Could not return" />
      {pending ? (
        <Card title={`Proof v${pending.version}`}>
          <p className="text-sm">
            {`Sent ${formatDateTime(pending.createdAt)} · ${pending.pages} page(s) · fonts embedded: ${pending.preflight.fontsEmbedded ? 'yes' : 'no'} · trim ${pending.preflight.trimMm.width} × ${pending.preflight.trimMm.height} mm, bleed ${pending.preflight.bleedMm} mm · smallest square ${pending.preflight.smallestSquareMm ?? '—'} mm · smallest digit ${pending.preflight.smallestDigitPt ?? '—'} pt`}
          </p>
          {pending.preflight.warnings.length > 0 ? (
            <ul className="list-disc pl-5 text-sm text-ink-soft">
              {pending.preflight.warnings.map((w, i) => (
                <li key={i}>{`${w.code.startsWith('error:') ? 'Error' : 'Warning'}: ${w.message}`}</li>
              ))}
            </ul>
          ) : null}
          <PreflightPages preflight={pending.preflight} />
          <p className="text-xs text-ink-muted">
            SHA-256 <code className="break-all">{pending.sha256}</code>
          </p>
          <div className="flex flex-wrap gap-2">
            <a className={buttonClasses('secondary')} href={`/api/editions/${e.id}/proofs/${pending.version}.pdf?download=1`}>
              {`Download proof v${pending.version}`}
            </a>
            <Button variant="primary" busy={approve.isPending} onClick={() => setApproving(true)}>
              Approve for press
            </Button>
          </div>
          <ConfirmDialog
            open={approving}
            title={`Approve proof v${pending.version} for press?`}
            confirmLabel={`Approve proof v${pending.version}`}
            busy={approve.isPending}
            error={approve.error}
            onCancel={() => setApproving(false)}
            onConfirm={() => approve.mutate(pending.version, { onSuccess: () => setApproving(false) })}
          >
            <p>{`The press file of ${e.publicationTitle} No. ${e.number} is made from proof v${pending.version} (${pending.pages} page(s)) without the PROOF stamp, and the desk is mailed. The proof can no longer be returned.`}</p>
            {pending.preflight.ok ? null : <p className="font-medium text-danger">The preflight of this proof found errors: read them above before you approve.</p>}
            <p>Check every page of the proof before it goes to press.</p>
          </ConfirmDialog>
          <form
            className="flex flex-col gap-2"
            noValidate
            onSubmit={(ev) => {
              ev.preventDefault();
              const parsed = returnProofSchema.safeParse({ notes });
              if (!parsed.success) {
                setNotesError(parsed.error.issues[0]?.message);
                return;
              }
              setNotesError(undefined);
              ret.mutate({ version: pending.version, notes: parsed.data.notes });
            }}
          >
            <label htmlFor="return-notes" className="text-sm font-semibold">
              Notes for the desk
            </label>
            <textarea
              id="return-notes"
              value={notes}
              onChange={(ev) => setNotes(ev.target.value)}
              rows={4}
              aria-invalid={notesError ? true : undefined}
              aria-describedby={notesError ? 'return-notes-error' : undefined}
              className="rounded-md border border-rule-strong bg-surface px-3 py-2"
            />
            {notesError ? (
              <p id="return-notes-error" className="text-sm text-danger">
                {notesError}
              </p>
            ) : null}
            <Button type="submit" variant="danger" busy={ret.isPending}>
              Return with notes
            </Button>
          </form>
          <iframe title={`Proof v${pending.version}`} src={`/api/editions/${e.id}/proofs/${pending.version}.pdf`} className="h-[36rem] w-full rounded border border-rule" />
        </Card>
      ) : null}
      {e.pressFile ? (
        <Card title="Press file">
          <p className="text-sm">{`From proof v${e.pressFile.version}, ${e.pressFile.pages} page(s), made ${formatDateTime(e.pressFile.createdAt)}.`}</p>
          <a className={buttonClasses('primary')} href={`/api/editions/${e.id}/press.pdf?download=1`}>
            Download press file
          </a>
        </Card>
      ) : null}
      <Card title="History">
        <ul className="flex flex-col gap-1 text-sm">
          {e.proofs.map((p) => (
            <li key={p.version} className="flex flex-wrap items-center gap-2">
              <span className="tabular-nums">{`v${p.version}`}</span>
              <StatusBadge tone={p.status === 'approved' ? 'success' : p.status === 'returned' ? 'warning' : 'neutral'}>{p.status[0]!.toUpperCase() + p.status.slice(1)}</StatusBadge>
              <span>{formatDateTime(p.createdAt)}</span>
              {p.notes ? <span className="text-ink-soft">{`“${p.notes}”`}</span> : null}
              <a href={`/api/editions/${e.id}/proofs/${p.version}.pdf?download=1`}>Download</a>
            </li>
          ))}
        </ul>
      </Card>
    </Page>
  );
}
