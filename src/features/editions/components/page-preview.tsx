import { useState } from 'react';
import { Alert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { Card, Loading } from '../../../components/page';

// The composer's page preview: every page of the edition as it is saved, as a PNG, before a
// proof goes out. The server renders the preview PDF (GET /api/editions/:id/preview.pdf,
// the same renderer as a proof); the browser turns its pages into PNGs with pdf.js
// (pdfjs-dist, loaded only when asked for). No native image library and no Debian tool is
// needed at run time; decision 016 says why.

type PreviewPage = { n: number; png: string; widthPx: number; heightPx: number };

/** Width of a rendered page in CSS pixels (the PNG is rendered at twice that for sharpness). */
const PAGE_WIDTH_PX = 300;

export async function renderPdfPages(pdf: ArrayBuffer): Promise<PreviewPage[]> {
  const pdfjs = await import('pdfjs-dist');
  const worker = await import('pdfjs-dist/build/pdf.worker.min.mjs?url');
  pdfjs.GlobalWorkerOptions.workerSrc = worker.default;
  const task = pdfjs.getDocument({ data: new Uint8Array(pdf) });
  const doc = await task.promise;
  try {
    const pages: PreviewPage[] = [];
    for (let n = 1; n <= doc.numPages; n++) {
      const page = await doc.getPage(n);
      const base = page.getViewport({ scale: 1 });
      const viewport = page.getViewport({ scale: (2 * PAGE_WIDTH_PX) / base.width });
      const canvas = document.createElement('canvas');
      canvas.width = Math.ceil(viewport.width);
      canvas.height = Math.ceil(viewport.height);
      await page.render({ canvas, viewport }).promise;
      pages.push({ n, png: canvas.toDataURL('image/png'), widthPx: PAGE_WIDTH_PX, heightPx: Math.round((PAGE_WIDTH_PX * viewport.height) / viewport.width) });
      page.cleanup();
    }
    return pages;
  } finally {
    await task.destroy();
  }
}

export function PagePreview({ editionId, updatedAt }: { editionId: string; updatedAt: string }) {
  const [state, setState] = useState<{ kind: 'idle' } | { kind: 'busy' } | { kind: 'error'; message: string } | { kind: 'done'; pages: PreviewPage[]; of: string }>({ kind: 'idle' });
  async function show() {
    setState({ kind: 'busy' });
    try {
      const res = await fetch(`/api/editions/${encodeURIComponent(editionId)}/preview.pdf`, { credentials: 'same-origin' });
      if (!res.ok) throw new Error(`The preview could not be made (${res.status}).`);
      setState({ kind: 'done', pages: await renderPdfPages(await res.arrayBuffer()), of: updatedAt });
    } catch (e) {
      setState({ kind: 'error', message: e instanceof Error ? e.message : 'The preview could not be made.' });
    }
  }
  const stale = state.kind === 'done' && state.of !== updatedAt;
  return (
    <Card title="Page preview">
      <p className="text-sm text-ink-muted">Every page as the saved edition prints (stamped PROOF, not stored, not sent).</p>
      {state.kind === 'busy' ? <Loading label="Rendering the pages…" /> : null}
      {state.kind === 'error' ? <Alert tone="danger">{state.message}</Alert> : null}
      {stale ? <Alert tone="warning">The edition was saved since this preview: show the pages again.</Alert> : null}
      {state.kind === 'done' ? (
        <ol className="flex flex-wrap gap-3" aria-label="Pages">
          {state.pages.map((p) => (
            <li key={p.n} className="flex flex-col items-center gap-1">
              <img src={p.png} width={p.widthPx} height={p.heightPx} alt={`Page ${p.n} of ${state.pages.length}`} className="border border-rule bg-white shadow-sm" />
              <a className="text-sm underline" href={p.png} download={`preview-page-${p.n}.png`}>
                {`Page ${p.n} (PNG)`}
              </a>
            </li>
          ))}
        </ol>
      ) : null}
      <Button size="sm" onClick={() => void show()} busy={state.kind === 'busy'}>
        {state.kind === 'done' ? 'Show the pages again' : 'Show the pages'}
      </Button>
    </Card>
  );
}
