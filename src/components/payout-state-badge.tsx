import type { PayoutState } from '../../shared/contracts/payouts';
import { StatusBadge } from './status-badge';

const tone = { pending: 'info', paid: 'success', failed: 'danger' } as const;
const label = { pending: 'Pending', paid: 'Paid', failed: 'Failed' } as const;

/** A payout's state as text, glyph and muted colour. */
export function PayoutStateBadge({ state }: { state: PayoutState }) {
  return <StatusBadge tone={tone[state]}>{label[state]}</StatusBadge>;
}
