// Every area's tables, one export line per area file (add yours below).
export * from './platform/auth/schema';
export * from './areas/accounts/schema';
export * from './platform/mail/schema';
export * from './platform/db/schema';
export * from './areas/payouts/schema';
export * from './areas/stock/schema';
export * from './areas/intake/schema';
export * from './platform/jobs/schema';
export * from './areas/foundry/schema';
export * from './areas/editions/publication-schema';
export * from './areas/editions/schema';
export * from './areas/puzzles/schema';
export * from './areas/reader/schema';
export * from './areas/integrations/schema';
