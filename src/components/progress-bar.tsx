/**
 * Progress of a long job (foundry run, upload, proof rendering). `value` between 0 and
 * `max`; leave it undefined for an indeterminate bar. The label names the job; the
 * text under the bar (`detail`, e.g. "412 of 1,000 graphs, 2 min left") is shown as-is.
 */
export function ProgressBar({ label, value, max = 1, detail }: { label: string; value?: number | undefined; max?: number; detail?: string }) {
  const known = value !== undefined && Number.isFinite(value) && max > 0;
  const fraction = known ? Math.min(1, Math.max(0, value / max)) : 0;
  const percent = Math.round(fraction * 100);
  return (
    <div className="flex flex-col gap-1">
      <div className="flex items-baseline justify-between text-sm">
        <span className="font-medium text-ink">{label}</span>
        <span className="tabular-nums text-ink-muted">{known ? `${percent}%` : 'working…'}</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={known ? 100 : undefined}
        aria-valuenow={known ? percent : undefined}
        aria-valuetext={detail}
        className="h-2.5 overflow-hidden rounded-full border border-rule bg-paper-deep"
      >
        <div
          className={`h-full bg-accent transition-[width] duration-300 ${known ? '' : 'w-1/3 animate-pulse'}`}
          style={known ? { width: `${percent}%` } : undefined}
        />
      </div>
      {detail ? <p className="text-xs tabular-nums text-ink-muted">{detail}</p> : null}
    </div>
  );
}
