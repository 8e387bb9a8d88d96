import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { makeDeductionPuzzle } from '../../../shared/puzzle/index';
import { parseTiling } from '../../../shared/tiling/index';
import { getPageTemplate, renderEditionPdf } from '../../../server/areas/print/index';
import { deductionPuzzle, sampleEdition } from './fixtures/sample-edition';
import { hasPoppler, popplerSkipReason, writeTemp } from './poppler';

// Issue 16: on a Deduction solution page every square the step list names carries its
// letter, legibly: the drawing is not to scale, each square with its letter and size, and a
// square too small for its label gets a callout. Checked from outside with poppler's
// pdftotext -bbox: each letter the steps name is a word inside the solution drawing's area
// (between the block's heading and its caption), at the template's minimum size or more.

// Published tilings (the catalogue in tests/fixtures/puzzle, see its SOURCE): order 12,
// 112 x 99; and the order-21 simple perfect squared square 112 x 112 (OEIS A014530).
const TILINGS = {
  '112x99': parseTiling('12 112 99 (56,27,29)(25,2)(31)(17,8)(43,13)(39)(30)'),
  '112x112': parseTiling('21 112 112 (50,35,27)(8,19)(15,17,11)(6,24)(29,25,9,2)(7,18)(16)(42)(4,37)(33)'),
};

type Word = { text: string; xMin: number; yMin: number; xMax: number; yMax: number; page: number };

/** Every word of the PDF with its box, from pdftotext -bbox (poppler). */
function words(file: string): Word[] {
  const html = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
  const out: Word[] = [];
  let page = 0;
  for (const line of html.split('\n')) {
    if (line.includes('<page ')) page += 1;
    const m = /<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/.exec(line);
    if (m) out.push({ xMin: Number(m[1]), yMin: Number(m[2]), xMax: Number(m[3]), yMax: Number(m[4]), text: m[5]!, page });
  }
  return out;
}

describe.skipIf(!hasPoppler)(`solution letters (${hasPoppler ? 'poppler' : popplerSkipReason})`, () => {
  for (const templateId of ['newspaper-column', 'a4']) {
    for (const [name, tiling] of Object.entries(TILINGS)) {
      it(`${name} in the ${templateId} template: every square the steps name has its letter in the drawing`, async () => {
        const t = getPageTemplate(templateId)!;
        const puzzle = makeDeductionPuzzle(tiling, { seed: 1 });
        const steps = puzzle.steps.map((s) => s.text);
        const named = new Set(puzzle.steps.flatMap((s) => [s.label, ...s.terms.map((x) => x.label).filter((l) => /^[A-Z]+$/.test(l))]));
        expect(named.size).toBeGreaterThan(3);
        const doc = sampleEdition(t, {
          puzzles: [deductionPuzzle(1, tiling, puzzle.givens.map((g) => tiling.squares.findIndex((q) => q.x === g.x && q.y === g.y)))],
          solutions: [{ slot: 1, kind: 'deduction', tiling, steps }],
        });
        const r = await renderEditionPdf(doc, { stamp: 'PROOF' });
        const all = words(writeTemp(r.pdf));
        const solutionPage = all.find((w) => w.text === 'Solutions')!.page;
        const onPage = all.filter((w) => w.page === solutionPage);
        const heading = onPage.find((w) => w.text === 'Puzzle')!;
        const caption = onPage.find((w) => w.text === `${tiling.W}` && w.yMin > heading.yMax)!;
        const inDrawing = onPage.filter((w) => w.yMin > heading.yMax && w.yMax < caption.yMin);
        const letters = new Set(inDrawing.map((w) => w.text));
        for (const label of named) expect(letters, `square ${label}`).toContain(label);
        // every square carries its size too, and no label is set below the template's floor
        expect(r.preflight.omittedLabels.filter((o) => o.where === 'solution')).toEqual([]);
        expect(r.preflight.smallestDigitPt).toBeGreaterThanOrEqual(t.minimums.digitPt);
        // the solution drawing says it is not to scale
        expect(onPage.map((w) => w.text).join(' ')).toMatch(/Drawing not to scale\./);
      });
    }
  }
});
