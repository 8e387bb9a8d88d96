import { beforeAll, describe, expect, it } from 'vitest';
import { renderEditionPdf } from '../../../server/areas/print/render-edition';
import { loadPageTemplates } from '../../../server/areas/print/templates';
import type { RenderResult } from '../../../server/areas/print/types';
import { deductionPuzzle, sampleEdition, TILING_33x32, TILING_69x61 } from './fixtures/sample-edition';
import { hasPoppler, pdffonts, pdfinfo, pdftotext, popplerSkipReason, writeTemp } from './poppler';

const templates = loadPageTemplates();
const PT_PER_MM = 72 / 25.4; // 1 pt = 1/72 in, 1 in = 25.4 mm (PDF Reference, default user space unit)

const rendered = new Map<string, { proof: RenderResult; press: RenderResult }>();

beforeAll(async () => {
  for (const [id, t] of templates) {
    const doc = sampleEdition(t);
    rendered.set(id, {
      proof: await renderEditionPdf(doc, { stamp: 'PROOF', proofVersion: 3 }),
      press: await renderEditionPdf(doc, { stamp: null }),
    });
  }
}, 120_000);

describe.skipIf(!hasPoppler)(`edition PDF read back with poppler (${hasPoppler ? 'present' : popplerSkipReason})`, () => {
  for (const id of ['a4', 'us-letter', 'newspaper-column']) {
    describe(id, () => {
      it('has a page size of trim + 2 x bleed', () => {
        const t = templates.get(id)!;
        const info = pdfinfo(writeTemp(rendered.get(id)!.press.pdf));
        expect(info.widthPt).toBeCloseTo((t.trim.widthMm + 2 * t.bleedMm) * PT_PER_MM, 1);
        expect(info.heightPt).toBeCloseTo((t.trim.heightMm + 2 * t.bleedMm) * PT_PER_MM, 1);
        expect(info.pages).toBe(rendered.get(id)!.press.pages);
      });

      it('embeds every font it uses', () => {
        const fonts = pdffonts(writeTemp(rendered.get(id)!.proof.pdf));
        expect(fonts.length).toBeGreaterThanOrEqual(3);
        for (const f of fonts) expect(f, f.name).toMatchObject({ emb: true });
        const names = fonts.map((f) => f.name).join(' ');
        expect(names).toMatch(/SourceSerif4/);
        expect(names).toMatch(/IBMPlexSans/);
      });

      it('stamps PROOF on every proof page and nowhere on the press file', () => {
        const r = rendered.get(id)!;
        const proofFile = writeTemp(r.proof.pdf);
        for (let p = 1; p <= r.proof.pages; p++) expect(pdftotext(proofFile, p)).toMatch(/PROOF v3/);
        expect(pdftotext(writeTemp(r.press.pdf))).not.toMatch(/PROOF/);
      });

      it('numbers its pages', () => {
        const r = rendered.get(id)!;
        const file = writeTemp(r.press.pdf);
        for (let p = 1; p <= r.press.pages; p++) expect(pdftotext(file, p)).toContain(`Page ${p} of ${r.press.pages}`);
      });

      it('prints the title, the puzzle numbers, the givens and the solution sizes', () => {
        const text = pdftotext(writeTemp(rendered.get(id)!.press.pdf));
        expect(text).toContain('The Saturday Quadrant');
        expect(text).toContain('Saturday 5 December 2026');
        expect(text).toContain('Puzzle 1');
        expect(text).toContain('Puzzle 2');
        expect(text).toContain('Givens: 18, 15, 14, 1.');
        expect(text).toMatch(/Solutions/);
        // the published sizes of both order-9 rectangles (squaring.net)
        expect(text.replace(/\s+/g, ' ')).toContain('69 × 61: 36, 33, 28, 25, 16, 9, 7, 5, 2.');
        expect(text.replace(/\s+/g, ' ')).toContain('33 × 32: 18, 15, 14, 10, 9, 8, 7, 4, 1.');
        expect(text).toContain('Top row: 18 + 15 = 33, the width.');
        expect(text).toMatch(/No gaps/);
      });
    });
  }
});

describe('preflight', () => {
  it('reports fonts embedded, trim size, pages and the smallest printed square and digit', () => {
    const { preflight, pages } = rendered.get('a4')!.press;
    const t = templates.get('a4')!;
    expect(preflight.fontsEmbedded).toBe(true);
    expect(preflight.embeddedFontFiles).toBeGreaterThanOrEqual(3);
    expect(preflight.fontsRegistered).toEqual(['Source Serif 4', 'IBM Plex Sans']);
    expect(preflight.trimMm).toEqual({ width: 210, height: 297 });
    expect(preflight.pages).toBe(pages);
    // the 2-square of the half-scale pieces is under the 3 mm floor: an error, not a warning
    expect(preflight.ok).toBe(false);
    expect(preflight.warnings.map((w) => w.code)).toContain('error:square-small');
    // The 2-square of the 69 x 61 in a half-scale piece row: side 2 * (column width / 69) / 2 mm.
    const colMm = (210 - t.marginsMm.left - t.marginsMm.right - t.gutterMm) / 2;
    const frameScale = Math.min(colMm / 69, t.drawing.maxHeightMm / 61);
    expect(preflight.smallestSquareMm).toBeCloseTo((2 * frameScale) / 2, 1);
    expect(preflight.smallestDigitPt).toBeGreaterThanOrEqual(t.minimums.digitPt);
  });

  it('fails under the common-practice minimum square and notes labels it left out', () => {
    const { preflight } = rendered.get('newspaper-column')!.press;
    const codes = preflight.warnings.map((w) => w.code);
    expect(codes).toContain('error:square-small');
    expect(preflight.ok).toBe(false);
    // the 1-square of the 33 x 32 could not carry a 6 pt label in a 76 mm column at scale;
    // solutions are drawn not to scale (issue 16), so every solution square keeps its label
    expect(preflight.omittedLabels.filter((o) => o.where === 'solution')).toEqual([]);
    expect(codes).not.toContain('solution-labels-omitted');
  });

  it('is clean of square warnings when every square is large enough', async () => {
    const t = templates.get('a4')!;
    const doc = sampleEdition(t, {
      puzzles: [deductionPuzzle(1, TILING_33x32, [0, 1, 4])],
      solutions: [{ slot: 1, kind: 'deduction', tiling: { W: 2, H: 1, squares: [{ x: 0, y: 0, s: 1 }, { x: 1, y: 0, s: 1 }] } }],
    });
    const r = await renderEditionPdf(doc, { stamp: null });
    expect(r.preflight.warnings).toEqual([]);
    expect(r.preflight.ok).toBe(true);
  });

  it('fails when a given cannot be printed legibly', async () => {
    const t = templates.get('newspaper-column')!;
    // a long, thin layout: the given's box is far too small for a 6 pt digit
    const doc = sampleEdition(t, {
      puzzles: [
        {
          slot: 1,
          kind: 'deduction',
          title: 'Thin',
          instructions: { type: 'doc', content: [] },
          grade: 1,
          layout: { W: 400, H: 2, rects: [{ x: 0, y: 0, w: 2, h: 2 }, { x: 2, y: 0, w: 398, h: 2 }] },
          givens: [{ rect: 0, size: 123 }],
        },
      ],
      solutions: [],
    });
    const r = await renderEditionPdf(doc, { stamp: 'PROOF' });
    expect(r.preflight.ok).toBe(false);
    expect(r.preflight.warnings.map((w) => w.code)).toContain('error:given-illegible');
  });

  it('prints no solution page when the edition carries no solutions', async () => {
    const t = templates.get('a4')!;
    const r = await renderEditionPdf(sampleEdition(t, { solutions: [], puzzles: [deductionPuzzle(1, TILING_69x61, [0, 1])] }), { stamp: null });
    expect(r.pages).toBe(1);
  });
});
