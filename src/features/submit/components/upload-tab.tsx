import { useId, useState, type DragEvent } from 'react';
import type { UploadLine, UploadReport } from '../../../../shared/contracts/submissions';
import { MAX_UPLOAD_BYTES, MAX_UPLOAD_LINES } from '../../../../shared/contracts/submissions';
import { Alert, ErrorAlert } from '../../../components/alert';
import { FramedTable } from '../../../components/framed-table';
import { ProgressBar } from '../../../components/progress-bar';
import { StatusBadge } from '../../../components/status-badge';
import { useUploadSubmissions, type UploadProgress } from '../api/upload-submissions';
import { whereText } from './verdict-view';

const dupText = { stock: 'already in the stock', pending: 'already waiting for review', 'this-file': 'repeats an earlier line of this file' } as const;

/** Upload a .txt or .bkp file of codes, one a line; a per-line report comes back. */
export function UploadTab() {
  const inputId = useId();
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [over, setOver] = useState(false);
  const [localError, setLocalError] = useState<string | null>(null);
  const upload = useUploadSubmissions(setProgress);

  function send(file: File | undefined) {
    setLocalError(null);
    if (!file) return;
    if (!/\.(txt|bkp)$/i.test(file.name)) return setLocalError(`"${file.name}" is not a .txt or .bkp file.`);
    if (file.size > MAX_UPLOAD_BYTES) return setLocalError(`"${file.name}" is larger than 5 MB.`);
    setProgress({ phase: 'uploading', loaded: 0, total: file.size });
    upload.mutate(file, { onSettled: () => setProgress(null) });
  }
  function onDrop(e: DragEvent) {
    e.preventDefault();
    setOver(false);
    send(e.dataTransfer.files[0]);
  }

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
          A .txt or .bkp file, one Bouwkamp or table code a line; blank lines and lines starting with # are skipped. At most 5 MB and {MAX_UPLOAD_LINES.toLocaleString('en-GB')} lines.
        </p>
        <label htmlFor={inputId} className="cursor-pointer font-semibold text-accent underline">
          or choose a file
        </label>
        <input id={inputId} type="file" accept=".txt,.bkp,text/plain" className="sr-only" onChange={(e) => send(e.target.files?.[0] ?? undefined)} />
      </div>
      {progress ? (
        progress.phase === 'uploading' ? (
          <ProgressBar label="Uploading" value={progress.loaded} max={progress.total} detail={`${Math.round(progress.loaded / 1024)} of ${Math.round(progress.total / 1024)} kB`} />
        ) : (
          <ProgressBar label="Checking every line" detail="Each code is decoded and verified exactly; nothing is stored until all lines are done." />
        )
      ) : null}
      {localError ? <Alert tone="danger" title="Not uploaded">{localError}</Alert> : null}
      <ErrorAlert error={upload.error} title="Not uploaded" />
      {upload.data ? <UploadReportView report={upload.data} /> : null}
    </div>
  );
}

function verdictBadge(l: UploadLine) {
  if (l.verdict === 'valid') return <StatusBadge tone="success">Valid</StatusBadge>;
  if (l.verdict === 'duplicate') return <StatusBadge tone="warning">Duplicate</StatusBadge>;
  return <StatusBadge tone="danger">Invalid</StatusBadge>;
}

export function UploadReportView({ report }: { report: UploadReport }) {
  const { summary } = report;
  return (
    <section aria-label="Upload report" className="flex flex-col gap-3">
      <Alert tone={summary.invalid ? 'warning' : 'success'} title={`${report.fileName}: ${summary.created} new submission${summary.created === 1 ? '' : 's'}`}>
        {summary.valid} valid, {summary.duplicate} duplicate, {summary.invalid} invalid. Invalid lines were not stored; fix them and upload again.
      </Alert>
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
