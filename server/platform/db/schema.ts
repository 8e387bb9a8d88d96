import { sqliteTable, text } from 'drizzle-orm/sqlite-core';

// Facts about this database itself, e.g. whether it was seeded in demo mode
// (so a restart without DEMO keeps showing the demo sign-ins).
export const appMeta = sqliteTable('app_meta', {
  key: text('key').primaryKey(),
  value: text('value').notNull(),
});
