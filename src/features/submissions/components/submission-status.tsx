import type { SubmissionStatus } from '../../../../shared/contracts/submissions';
import { StatusBadge } from '../../../components/status-badge';

export function SubmissionStatusBadge({ status }: { status: SubmissionStatus }) {
  if (status === 'accepted') return <StatusBadge tone="success">Accepted</StatusBadge>;
  if (status === 'rejected') return <StatusBadge tone="danger">Not accepted</StatusBadge>;
  return <StatusBadge tone="info">Pending review</StatusBadge>;
}
