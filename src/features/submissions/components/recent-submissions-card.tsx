import { Link } from 'react-router-dom';
import { useSubmissionList } from '../../../api/submissions';
import { ButtonLink } from '../../../components/button';
import { Loading } from '../../../components/page';
import { formatDate } from '../../../lib/format';
import { SubmissionStatusBadge } from './submission-status';

/** Setter Home card: my five latest submissions and a Submit button. */
export function RecentSubmissionsCard() {
  const list = useSubmissionList({ page: 1, pageSize: 5, sort: '-createdAt' });
  if (list.isPending) return <Loading />;
  const items = list.data?.items ?? [];
  return (
    <div className="flex flex-col gap-3">
      {items.length === 0 ? (
        <p className="text-sm text-ink-muted">Nothing sent yet.</p>
      ) : (
        <ul className="flex flex-col gap-2 text-sm">
          {items.map((s) => (
            <li key={s.id} className="flex items-center justify-between gap-2">
              <Link to="/submissions">{s.title ?? `${s.width} × ${s.height}, order ${s.order}`}</Link>
              <span className="flex items-center gap-2">
                <SubmissionStatusBadge status={s.status} />
                <span className="text-xs text-ink-muted">{formatDate(s.createdAt)}</span>
              </span>
            </li>
          ))}
        </ul>
      )}
      <div>
        <ButtonLink to="/submit" variant="primary" size="sm">Submit</ButtonLink>
      </div>
    </div>
  );
}
