import { defineConfig } from 'drizzle-kit';

// Schema is split by area under server/db/schema/; generated SQL lives in drizzle/
// and is applied at start-up and in every test (see server/db/migrate.ts).
export default defineConfig({
  dialect: 'sqlite',
  schema: './server/db/schema/*.ts',
  out: './drizzle',
});
