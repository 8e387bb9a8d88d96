import { useSubmissionList } from '../../../api/submissions';
import { Loading } from '../../../components/page';

/** Editor Home card: how many submissions wait for review. */
export function PendingSubmissionsCard() {
  const list = useSubmissionList({ status: 'pending', page: 1, pageSize: 1 });
  if (list.isPending) return <Loading />;
  const n = list.data?.total ?? 0;
  return <p className="text-sm"><span className="text-2xl font-semibold tabular-nums">{n}</span> submission{n === 1 ? '' : 's'} waiting for review.</p>;
}
