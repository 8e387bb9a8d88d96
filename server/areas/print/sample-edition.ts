import { plainRichText } from '../../../shared/contracts/editions';
import type { PageTemplate } from '../../../shared/contracts/templates';
import { exhaustiveTilings } from '../../../shared/foundry/index';
import type { Tiling } from '../../../shared/tiling/index';
import type { EditionDocument, LayoutRect } from './types';

// The sample page of a template (admin Templates screen): two layout samples made from
// tilings our own foundry finds (order 10), so the page shows real drawings at the
// template's sizes.

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

/** A monotone remapping of the coordinates (rank of each distinct value): the layout not to scale. */
export function notToScaleLayout(t: Tiling): { W: number; H: number; rects: LayoutRect[] } {
  const xs = [...new Set(t.squares.flatMap((q) => [q.x, q.x + q.s]))].sort((a, b) => a - b);
  const ys = [...new Set(t.squares.flatMap((q) => [q.y, q.y + q.s]))].sort((a, b) => a - b);
  const rx = (v: number) => xs.indexOf(v) * 4;
  const ry = (v: number) => ys.indexOf(v) * 4;
  return {
    W: rx(t.W),
    H: ry(t.H),
    rects: t.squares.map((q) => ({ x: rx(q.x), y: ry(q.y), w: rx(q.x + q.s) - rx(q.x), h: ry(q.y + q.s) - ry(q.y) })),
  };
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
        layout: notToScaleLayout(b),
        givens: [0, 1, 2].map((i) => ({ rect: i, size: b.squares[i]?.s ?? 0 })),
      },
    ],
    solutions: [
      { slot: 1, kind: 'assembly', tiling: a },
      { slot: 2, kind: 'deduction', tiling: b, steps: ['A step of the solution, in the caption size.'] },
    ],
  };
}
