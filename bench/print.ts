// Print benchmark (`npm run bench`): a 12-puzzle edition rendered to PDF (A4, puzzles and
// solutions), cold (first render, including the lazy @react-pdf/renderer import) and warm;
// and a puzzle PNG at web size (640 px, labels) and 2x (1280 px). Targets from issue 7:
// edition under 3 s, PNG under 30 ms. Tilings come from our own foundry (order 12).
import { plainRichText } from '../shared/contracts/editions';
import { notToScaleRects } from '../shared/puzzle/index';
import { renderTilingPng } from '../server/platform/images/tiling-png';
import { renderEditionPdf } from '../server/areas/print/render-edition';
import { foundryTilings } from '../server/areas/print/sample-edition';
import { getPageTemplate } from '../server/areas/print/templates';
import type { EditionDocument, PuzzlePrint } from '../server/areas/print/types';
import { templatePressDefaults } from '../shared/contracts/templates';
import { toPdfX, PT_PER_MM } from '../server/areas/print/pdfx';
import { preflightPdf } from '../server/areas/print/preflight';


const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;

async function main() {
  const tilings = foundryTilings(12, 12);
  const template = getPageTemplate('a4');
  if (!template || tilings.length < 12) throw new Error('print bench: need the a4 template and 12 foundry tilings');
  const puzzles: PuzzlePrint[] = tilings.map((t, i) =>
    i % 2 === 0
      ? { slot: i + 1, kind: 'assembly', title: `Rectangle ${t.W} by ${t.H}`, instructions: plainRichText('Place every piece.'), grade: 2, frame: { W: t.W, H: t.H }, pieces: t.squares.map((q) => q.s), starters: [] }
      : { slot: i + 1, kind: 'deduction', title: 'Find every size', instructions: plainRichText('Not to scale.'), grade: 3, layout: notToScaleRects(t), givens: [0, 1, 2].map((r) => ({ rect: r, size: t.squares[r]?.s ?? 0 })) },
  );
  const doc: EditionDocument = {
    publicationTitle: 'Squared Away Monthly',
    editionNumber: 12,
    editionDate: '2027-01-01',
    template,
    introduction: plainRichText('Twelve squared rectangles.'),
    puzzles,
    solutions: tilings.map((t, i) => ({ slot: i + 1, kind: i % 2 === 0 ? 'assembly' : 'deduction', tiling: t, steps: i % 2 === 0 ? undefined : ['A step.', 'Another step.'] })),
  };
  let t0 = performance.now();
  const first = await renderEditionPdf(doc, { stamp: 'PROOF', proofVersion: 1 });
  const cold = performance.now() - t0;
  const warm: number[] = [];
  for (let i = 0; i < 3; i++) {
    t0 = performance.now();
    await renderEditionPdf(doc, { stamp: 'PROOF', proofVersion: 1 });
    warm.push(performance.now() - t0);
  }
  const ok = (ms: number, target: number) => (ms < target ? `under ${target} ms` : `OVER ${target} ms`);
  console.log(`print: 12-puzzle A4 edition, ${first.pages} pages, ${(first.pdf.length / 1024).toFixed(0)} kB: cold ${cold.toFixed(0)} ms (${ok(cold, 3000)}), warm median ${median(warm).toFixed(0)} ms (${ok(median(warm), 3000)})`);

  // The PDF/X share of a render: the press post-processing (pdfx.ts) and the preflight of the finished file.
  const press = { ...templatePressDefaults(template), profileSha256: null };
  const [layout, renderer] = await Promise.all([import('../server/areas/print/edition-layout'), import('@react-pdf/renderer')]);
  const raw = await renderer.renderToBuffer(layout.buildEditionLayout(doc, { stamp: 'PROOF' }).element as Parameters<typeof renderer.renderToBuffer>[0]);
  const post: number[] = [];
  const pre: number[] = [];
  for (let i = 0; i < 5; i++) {
    t0 = performance.now();
    const pdf = await toPdfX(raw, { press, trimPt: { width: template.trim.widthMm * PT_PER_MM, height: template.trim.heightMm * PT_PER_MM }, bleedPt: template.bleedMm * PT_PER_MM, title: 'bench', createdAt: new Date() });
    post.push(performance.now() - t0);
    t0 = performance.now();
    await preflightPdf({ template, press, pdf, fontsRegistered: [], pageSizePt: { width: 0, height: 0 }, metrics: { smallestSquareMm: null, smallestDigitPt: null, omittedLabels: [], illegibleGivens: [] } });
    pre.push(performance.now() - t0);
  }
  console.log(`print: of that, PDF/X post-processing median ${median(post).toFixed(0)} ms, preflight of the finished file median ${median(pre).toFixed(0)} ms`);

  const t = tilings[0]!;
  for (const width of [640, 1280]) {
    for (let i = 0; i < 5; i++) renderTilingPng(t, { width, labels: true });
    const times: number[] = [];
    for (let i = 0; i < 30; i++) {
      t0 = performance.now();
      renderTilingPng(t, { width, labels: true });
      times.push(performance.now() - t0);
    }
    console.log(`print: puzzle PNG ${width} px wide (${t.W} x ${t.H}, labels): median ${median(times).toFixed(1)} ms (${ok(median(times), 30)})`);
  }
}

await main();
