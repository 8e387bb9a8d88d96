// The 12-puzzle A4 edition the load bench renders while it measures (the same document as
// bench/print.ts: six Assembly and six Deduction puzzles of order-12 foundry tilings, with their solutions).
import { plainRichText } from '../shared/contracts/editions';
import { notToScaleRects } from '../shared/puzzle/index';
import { foundryTilings } from '../server/areas/print/sample-edition';
import { getPageTemplate } from '../server/areas/print/index';
import type { EditionDocument, PuzzlePrint } from '../server/areas/print/index';

export function benchEdition(): EditionDocument {
  const tilings = foundryTilings(12, 12);
  const template = getPageTemplate('a4');
  if (!template || tilings.length < 12) throw new Error('load bench: need the a4 template and 12 foundry tilings');
  const puzzles: PuzzlePrint[] = tilings.map((t, i) =>
    i % 2 === 0
      ? { slot: i + 1, kind: 'assembly', title: `Rectangle ${t.W} by ${t.H}`, instructions: plainRichText('Place every piece.'), grade: 2, frame: { W: t.W, H: t.H }, pieces: t.squares.map((q) => q.s), starters: [] }
      : { slot: i + 1, kind: 'deduction', title: 'Find every size', instructions: plainRichText('Not to scale.'), grade: 3, layout: notToScaleRects(t), givens: [0, 1, 2].map((r) => ({ rect: r, size: t.squares[r]?.s ?? 0 })) },
  );
  return {
    publicationTitle: 'Squared Away Monthly',
    editionNumber: 12,
    editionDate: '2027-01-01',
    template,
    introduction: plainRichText('Twelve squared rectangles.'),
    puzzles,
    solutions: tilings.map((t, i) => ({ slot: i + 1, kind: i % 2 === 0 ? 'assembly' : 'deduction', tiling: t, steps: i % 2 === 0 ? undefined : ['A step.', 'Another step.'] })),
  };
}
