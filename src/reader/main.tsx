// The readers' play script (decision 080): a small entry of its own, not the staff app. It
// turns the server-rendered puzzle page into a board: the page's data (no answer in it)
// comes from the JSON block the server wrote. Loaded by server/areas/reader/pages.ts.
import '@vitejs/plugin-react/preamble';
// zod without eval, before any schema is built (our CSP has no 'unsafe-eval'; see the file)
import '../lib/zod-jitless';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { PlayApp } from './play-app';
import { pageDataSchema } from './schemas';

const block = document.getElementById('reader-data');
const mount = document.getElementById('play');
if (block && mount) {
  const data = pageDataSchema.parse(JSON.parse(block.textContent ?? 'null'));
  mount.replaceChildren();
  createRoot(mount).render(
    <StrictMode>
      <PlayApp data={data} />
    </StrictMode>,
  );
}
