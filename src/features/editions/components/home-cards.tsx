import { Link } from 'react-router-dom';
import { useEditions } from '../../../api/editions';
import { ErrorAlert } from '../../../components/alert';
import { Loading } from '../../../components/page';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useDueEditions } from '../api/due-editions';

const when = (daysLeft: number) => (daysLeft < 0 ? `${-daysLeft} day(s) overdue` : daysLeft === 0 ? 'today' : daysLeft === 1 ? 'tomorrow' : `in ${daysLeft} days`);

/** Editor Home card: editions due within two weeks (or overdue) and what each still needs. */
export function EditionsDueCard() {
  const due = useDueEditions();
  if (due.isPending) return <Loading />;
  if (due.error) return <ErrorAlert error={due.error} />;
  const items = due.data.items;
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        <span className="text-2xl font-semibold tabular-nums">{items.length}</span> edition{items.length === 1 ? '' : 's'} due in the next {due.data.days} days.
      </p>
      <ul className="flex flex-col gap-2">
        {items.slice(0, 5).map((e) => (
          <li key={e.id}>
            <Link className="font-medium underline" to={`/editions/${e.id}`}>{`${e.publicationTitle} No. ${e.number}`}</Link>
            {`, ${formatDate(e.date)} (${when(e.daysLeft)})`}
            <span className="block text-ink-muted">{`Needs: ${e.needs.join('; ')}.`}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Editor Home card: proofs the printer sent back, with the printer's note. */
export function ProofsReturnedCard() {
  const list = useEditions({ state: 'draft' });
  if (list.isPending) return <Loading />;
  if (list.error) return <ErrorAlert error={list.error} />;
  const returned = list.data.filter((e) => e.latestProofStatus === 'returned');
  return (
    <div className="flex flex-col gap-2 text-sm">
      <p>
        <span className="text-2xl font-semibold tabular-nums">{returned.length}</span> proof{returned.length === 1 ? '' : 's'} returned by the printer.
      </p>
      <ul className="flex flex-col gap-2">
        {returned.slice(0, 5).map((e) => (
          <li key={e.id}>
            <Link className="font-medium underline" to={`/editions/${e.id}`}>{`${e.publicationTitle} No. ${e.number}, proof v${e.latestProofVersion ?? ''}`}</Link>
            {e.latestProofAt ? ` (sent ${formatDateTime(e.latestProofAt)})` : ''}
            {e.returnNotes ? <span className="block text-ink-muted">{`“${e.returnNotes}”`}</span> : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
