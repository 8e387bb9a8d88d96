import { defineConfig } from 'drizzle-kit';

// Tables live with their owners: server/platform/<part>/schema.ts and server/areas/<area>/schema.ts;
// server/schema.ts lists them all. Generated SQL lives in drizzle/ and is applied at start-up and in
// every test (see server/platform/db/client.ts).
export default defineConfig({
  dialect: 'sqlite',
  schema: './server/schema.ts',
  out: './drizzle',
});
