import { useState } from 'react';
import { Link } from 'react-router-dom';
import { ErrorAlert } from '../../../components/alert';
import { Loading } from '../../../components/page';
import { formatDateTime } from '../../../lib/format';
import { useRuns } from '../api/list-runs';
import { describeRun, foundText } from './run-progress';

const WEEK_MS = 7 * 86_400_000;

/** Editor Home card: foundry runs finished in the last seven days and what they added to the stock. */
export function FinishedRunsCard() {
  const runs = useRuns();
  // the week is counted from when the card was first drawn (a render reads no clock)
  const [since] = useState(() => Date.now() - WEEK_MS);
  if (runs.isPending) return <Loading />;
  if (runs.error) return <ErrorAlert error={runs.error} />;
  const done = runs.data.filter((r) => r.state === 'done' && r.finishedAt !== null && Date.parse(r.finishedAt) >= since);
  const added = done.reduce((n, r) => n + r.addedToStock, 0);
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        <span className="text-2xl font-semibold tabular-nums">{done.length}</span> run{done.length === 1 ? '' : 's'} finished in the last 7 days, {added.toLocaleString('en-GB')} new tiling{added === 1 ? '' : 's'} in the stock.
      </p>
      <ul className="flex flex-col gap-2">
        {done.slice(0, 5).map((r) => (
          <li key={r.id}>
            <Link className="font-medium underline" to={`/foundry/runs/${r.id}`}>
              {describeRun(r)}
            </Link>
            {`, ${formatDateTime(r.finishedAt!)}`}
            <span className="block text-ink-muted">{`${foundText(r)}; ${r.addedToStock.toLocaleString('en-GB')} added to the stock.`}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}
