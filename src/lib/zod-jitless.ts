import { config } from 'zod';

// Imported FIRST by every browser entry (src/main.tsx, src/reader/main.tsx). Our
// Content-Security-Policy allows no eval (script-src 'self'). zod 4 builds fast object parsers
// with `new Function` unless told not to, and its probe for that is reported by the browser as a
// CSP violation even though zod catches it. zod decides when each z.object() is built (module
// load of the schema files), so this must run before any module that defines a schema: as the
// entry's first import it does (ES modules run their imports in order). Checked in Chromium by
// tests/e2e/security.e2e.test.ts.
config({ jitless: true });
