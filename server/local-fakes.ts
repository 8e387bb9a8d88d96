import { localPaymentsFake } from './areas/payouts/index';
import type { LocalFake } from './platform/local-fake';

// Local stand-ins for outside services, started by server/bootstrap.ts (the fake SMTP server
// is started there directly, since mail needs its URL first). One line per fake.
export const localFakes: LocalFake[] = [localPaymentsFake];
