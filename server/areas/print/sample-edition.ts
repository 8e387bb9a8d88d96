import { plainRichText } from '../../../shared/contracts/editions';
import type { PageTemplate } from '../../../shared/contracts/templates';
import { exhaustiveTilings } from '../../../shared/foundry/index';
import { notToScaleRects } from '../../../shared/puzzle/index';
import type { Tiling } from '../../../shared/tiling/index';
import type { EditionDocument } from './types';

// The sample page of a template (admin Templates screen): two layout samples made from
// tilings our own foundry finds (order 10), so the page shows real drawings at the
// template's sizes. The Deduction sample is drawn not to scale by the puzzle engine's
// notToScaleRects, as the puzzles area draws real Deduction puzzles.

let cached: Tiling[] | undefined;

export function foundryTilings(order: number, count: number): Tiling[] {
  const out: Tiling[] = [];
  exhaustiveTilings({
    order,
    onFound: (t) => {
      if (t.perfect && out.length < count) out.push(t.tiling);
    },
  });
  return out;
}

export function templateSampleEdition(template: PageTemplate): EditionDocument {
  cached ??= foundryTilings(10, 2);
  const [a, b] = cached;
  if (!a || !b) throw new Error('the foundry found fewer than two perfect tilings of order 10');
  const largest = [...a.squares].sort((p, q) => q.s - p.s)[0]!;
  return {
    publicationTitle: `Sample page: ${template.name}`,
    editionNumber: 1,
    editionDate: '2026-01-03',
    template,
    introduction: plainRichText('This sample shows the template at its real sizes: title, body text, drawings, captions and the solution section. The puzzles are layout samples, not puzzles to print.'),
    puzzles: [
      {
        slot: 1,
        kind: 'assembly',
        title: 'Layout sample',
        instructions: plainRichText('Instructions in the body size of the template.'),
        grade: 1,
        frame: { W: a.W, H: a.H },
        pieces: a.squares.map((q) => q.s),
        starters: [{ size: largest.s, x: largest.x, y: largest.y }],
      },
      {
        slot: 2,
        kind: 'deduction',
        title: 'Layout sample',
        instructions: plainRichText('A drawing not to scale with a few sizes shown.'),
        grade: 1,
        layout: notToScaleRects(b),
        givens: [0, 1, 2].map((i) => ({ rect: i, size: b.squares[i]?.s ?? 0 })),
      },
    ],
    solutions: [
      { slot: 1, kind: 'assembly', tiling: a },
      { slot: 2, kind: 'deduction', tiling: b, steps: ['A step of the solution, in the caption size.'] },
    ],
  };
}
