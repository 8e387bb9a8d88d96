import { useId, useState, type DragEvent } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { UploadJob, UploadLine, UploadReport } from '../../../../shared/contracts/submissions';
import { notPlainTextReason } from '../../../../shared/contracts/code-list';
import { MAX_UPLOAD_BYTES, MAX_UPLOAD_LINES } from '../../../../shared/contracts/submissions';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { FramedTable } from '../../../components/framed-table';
import { JobProgress } from '../../../components/job-progress';
import { ProgressBar } from '../../../components/progress-bar';
import { StatusBadge } from '../../../components/status-badge';
import { isUploadActive, useCancelUpload, useRetryUpload, useUpload, useUploadSubmissions, type UploadProgress } from '../api/upload-submissions';
import { whereText } from './verdict-view';

const dupText = { stock: 'already in the stock', pending: 'already waiting for review', 'this-file': 'repeats an earlier line of this file' } as const;

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`;

/**
 * Upload a plain-text file of codes, one a line, whatever its name (read by its content). The server answers at once with an upload
 * job (kept in the address as ?upload=ID, so a reload follows it still): its lines are checked
 * on a worker and stored as they come, with progress, a Cancel, and the per-line report at the end.
 */
export function UploadTab() {
  const inputId = useId();
  const [search, setSearch] = useSearchParams();
  const uploadId = search.get('upload');
  const [sending, setSending] = useState<UploadProgress | null>(null);
  const [over, setOver] = useState(false);
  const [localError, setLocalError] = useState<string | null>(null);
  const upload = useUploadSubmissions(setSending);
  const job = useUpload(uploadId);

  function follow(id: string) {
    setSearch((prev) => { const n = new URLSearchParams(prev); n.set('upload', id); return n; }, { replace: true });
  }
  async function send(file: File | undefined) {
    setLocalError(null);
    if (!file) return;
    if (file.size > MAX_UPLOAD_BYTES) return setLocalError(`"${file.name}" is larger than 5 MB.`);
    // read by its content, whatever its name: plain text, one code a line (the server asks the same)
    const notText = notPlainTextReason(new Uint8Array(await file.arrayBuffer()));
    if (notText) return setLocalError(`"${file.name}" cannot be read as a list of codes: ${notText}.`);
    setSending({ loaded: 0, total: file.size });
    upload.mutate(file, { onSuccess: (u) => follow(u.id), onSettled: () => setSending(null) });
  }
  function onDrop(e: DragEvent) {
    e.preventDefault();
    setOver(false);
    void send(e.dataTransfer.files[0]);
  }
  const busy = sending !== null || (job.data !== undefined && isUploadActive(job.data));

  return (
    <div className="flex flex-col gap-4">
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={`flex flex-col items-center gap-2 rounded-lg border-2 border-dashed p-8 text-center ${over ? 'border-accent bg-accent-soft/30' : 'border-rule-strong bg-surface'}`}
      >
        <p className="font-semibold text-ink">Drop a file of codes here</p>
        <p className="text-sm text-ink-muted">
          A plain-text file (any name, e.g. our own squarewright-stock.txt), one Bouwkamp or table code a line; blank lines and lines starting with # are skipped. At most 5 MB and {MAX_UPLOAD_LINES.toLocaleString('en-GB')} lines.
        </p>
        <label htmlFor={inputId} className="cursor-pointer font-semibold text-accent underline">
          or choose a file
        </label>
        <input id={inputId} type="file" className="sr-only" disabled={busy} onChange={(e) => void send(e.target.files?.[0] ?? undefined)} />
      </div>
      {sending ? <ProgressBar label="Uploading" value={sending.loaded} max={sending.total} detail={`${Math.round(sending.loaded / 1024)} of ${Math.round(sending.total / 1024)} kB`} /> : null}
      {localError ? <Alert tone="danger" title="Not uploaded">{localError}</Alert> : null}
      <ErrorAlert error={upload.error} title="Not uploaded" />
      {uploadId ? <ErrorAlert error={job.error} title="This upload cannot be shown" /> : null}
      {job.data ? <UploadJobView job={job.data} /> : null}
    </div>
  );
}

/** An upload being checked (progress and Cancel), or ended (what happened, the report, and going on where it may). */
export function UploadJobView({ job }: { job: UploadJob }) {
  const cancel = useCancelUpload();
  const retry = useRetryUpload();
  const s = job.summary;
  const soFar = `${plural(s.created, 'new submission')} so far`;
  if (isUploadActive(job)) {
    return (
      <section aria-label="Upload in progress" className="flex flex-col gap-3" aria-live="polite">
        <JobProgress label={`Checking ${job.fileName}`} state={job.state} progress={job.progress} detail={soFar} />
        <p className="text-sm text-ink-muted">Each code is decoded and verified exactly on a worker; lines are stored as they are checked. You may leave this page: the upload goes on.</p>
        <div>
          <Button variant="danger" size="sm" onClick={() => cancel.mutate(job.id)} busy={cancel.isPending}>Cancel the upload</Button>
        </div>
        <ErrorAlert error={cancel.error} title="Could not cancel" />
      </section>
    );
  }
  const stopped: Partial<Record<UploadJob['state'], string>> = {
    cancelled: `Cancelled. ${plural(s.lines, 'line')} had been checked and stored (${plural(s.created, 'new submission')}); the rest of the file was not read.`,
    interrupted: `The server stopped while this upload was checked. ${plural(s.lines, 'line')} had been stored (${plural(s.created, 'new submission')}).`,
    failed: `The upload did not finish${job.error ? `: ${job.error}` : ''}. ${plural(s.lines, 'line')} had been stored.`,
  };
  return (
    <div className="flex flex-col gap-3">
      {job.state !== 'done' ? (
        <Alert tone={job.state === 'failed' ? 'danger' : 'warning'} title={`${job.fileName}: not finished`}>
          <p>{stopped[job.state]}</p>
          {job.retry.resume || job.retry.restart ? (
            <div className="mt-2 flex flex-wrap gap-2">
              {job.retry.resume ? <Button size="sm" variant="primary" onClick={() => retry.mutate({ id: job.id, how: 'resume' })} busy={retry.isPending}>Go on from where it stopped</Button> : null}
              {job.retry.restart ? <Button size="sm" onClick={() => retry.mutate({ id: job.id, how: 'restart' })} busy={retry.isPending}>Check the whole file again</Button> : null}
            </div>
          ) : null}
        </Alert>
      ) : null}
      <ErrorAlert error={retry.error} title="Could not go on" />
      {job.report ? <UploadReportView report={job.report} finished={job.state === 'done'} /> : null}
    </div>
  );
}

function verdictBadge(l: UploadLine) {
  if (l.verdict === 'valid') return <StatusBadge tone="success">Valid</StatusBadge>;
  if (l.verdict === 'duplicate') return <StatusBadge tone="warning">Duplicate</StatusBadge>;
  return <StatusBadge tone="danger">Invalid</StatusBadge>;
}

export function UploadReportView({ report, finished = true }: { report: UploadReport; finished?: boolean }) {
  const { summary } = report;
  return (
    <section aria-label="Upload report" className="flex flex-col gap-3">
      {finished ? (
        <Alert tone={summary.invalid ? 'warning' : 'success'} title={`${report.fileName}: ${plural(summary.created, 'new submission')}`}>
          {summary.valid} valid, {summary.duplicate} duplicate, {summary.invalid} invalid. Invalid lines were not sent for review; fix them and upload again.
        </Alert>
      ) : null}
      <FramedTable caption="Report per line" headings={['Line', 'Verdict', 'Tiling', 'Details']} ruledHead>
        {report.lines.map((l) => (
          <tr key={l.line} className="border-b border-rule last:border-b-0">
            <td className="px-3 py-2 tabular-nums">{l.line}</td>
            <td className="px-3 py-2">{verdictBadge(l)}</td>
            <td className="px-3 py-2 tabular-nums">{l.width ? `${l.width} × ${l.height}, order ${l.order}` : '–'}</td>
            <td className="px-3 py-2">
              {l.error ? (
                <span>
                  {l.error.message}
                  {whereText(l.error.where, { withLine: false }) ? <span className="text-ink-muted"> ({whereText(l.error.where, { withLine: false })} of line {l.line})</span> : null}
                </span>
              ) : l.duplicateOf ? (
                <span>{dupText[l.duplicateOf]}{l.submissionId ? ' – sent for review, flagged as a duplicate' : ' – not sent again'}</span>
              ) : (
                <span>sent for review</span>
              )}
            </td>
          </tr>
        ))}
      </FramedTable>
    </section>
  );
}
