import type { Role } from '../../../shared/contracts/common';

// The four demo accounts (product.md). Only created, and only shown, in demo mode.
export const demoPassword = 'squarewright-demo';
export const demoAccounts: { email: string; role: Role; name: string }[] = [
  { email: 'admin@demo.squarewright.test', role: 'admin', name: 'Ada Marlowe' },
  { email: 'editor@demo.squarewright.test', role: 'editor', name: 'Edwin Thorne' },
  { email: 'setter@demo.squarewright.test', role: 'setter', name: 'Selma Quist' },
  { email: 'printer@demo.squarewright.test', role: 'printer', name: 'Piet Hollis' },
];
