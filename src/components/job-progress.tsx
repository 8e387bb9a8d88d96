import type { JobProgressView, JobStateView } from '../../shared/contracts/jobs';
import { ProgressBar } from './progress-bar';

// Progress of a job (foundry run, upload, proof) as the job system reports it: the phase with
// done of total, the rate and the time left, then the storing of results with its own rate and
// time left; a job split into parts says how many are done.

export function formatDuration(ms: number): string {
  const s = Math.round(ms / 1000);
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${s % 60} s`;
  return `${Math.floor(m / 60)} h ${m % 60} min`;
}

const n = (x: number) => Math.round(x).toLocaleString('en-GB');

/** "412 of 1,342 graphs solved · 310 /s · 3 s left · 1,200 stored · parts 2 of 4 done". */
export function jobProgressDetail(state: JobStateView, p: JobProgressView | null): string {
  if (!p) return state === 'queued' ? 'waiting for a free worker' : '';
  const running = state === 'running';
  // a finished job says what it left behind, not the phase it was last in
  if (state === 'done' && p.phase === STORING) {
    const stored = p.stored ?? p.done;
    return `${n(stored)} ${stored === 1 ? 'result' : 'results'} stored`;
  }
  const parts = [`${n(p.done)}${p.total !== undefined ? ` of ${n(p.total)}` : ''} ${p.phase ?? ''}`.trim()];
  if (running && p.rate !== undefined) parts.push(`${p.rate.toLocaleString('en-GB')} /s`);
  if (running && p.etaMs !== undefined) parts.push(`${formatDuration(p.etaMs)} left`);
  // while searching, the results stored so far (the storing phase shows them as its own count)
  if (p.stored !== undefined && p.phase !== STORING && (p.stored > 0 || (p.received ?? 0) > 0)) parts.push(`${n(p.stored)} stored`);
  if (p.parts) parts.push(`parts ${p.parts.done} of ${p.parts.count} done`);
  return parts.join(' · ');
}

/** The job system's name for its last phase (server/platform/jobs/progress.ts). */
export const STORING = 'storing results';

/** A progress bar for a job; `detail` adds to the job system's own line (e.g. "2,700 tilings found"). */
export function JobProgress({ label, state, progress, detail }: { label: string; state: JobStateView; progress: JobProgressView | null; detail?: string }) {
  const finished = state === 'done';
  const line = [jobProgressDetail(state, progress), detail].filter(Boolean).join(' · ');
  const known = progress?.total !== undefined && progress.total > 0;
  return <ProgressBar label={label} value={finished ? 1 : known ? progress.done : undefined} max={finished ? 1 : known ? progress.total : 1} detail={line} />;
}
