import type { PlatformDeps } from '../../platform/deps';
import type { PaymentsProvider } from './provider';

// The payouts area's ports. It needs the payments provider (the real one, or the local fake;
// null when payments are not configured), chosen by server/compose.ts from the environment.
// What it offers others (the editions' FeeRecorder) is typed in ../editions/ports.ts and
// implemented in ./ledger.ts.

export type MoneyDeps = PlatformDeps & { payments: PaymentsProvider | null };
