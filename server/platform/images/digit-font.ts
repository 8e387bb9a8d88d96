// A tiny bitmap digit font of our own: each glyph is 3 x 5 cells, rows top to bottom,
// '#' = ink. Scaled up by whole cells when drawn.
const GLYPHS: Record<string, string[]> = {
  '0': ['###', '#.#', '#.#', '#.#', '###'],
  '1': ['.#.', '##.', '.#.', '.#.', '###'],
  '2': ['###', '..#', '###', '#..', '###'],
  '3': ['###', '..#', '.##', '..#', '###'],
  '4': ['#.#', '#.#', '###', '..#', '..#'],
  '5': ['###', '#..', '###', '..#', '###'],
  '6': ['###', '#..', '###', '#.#', '###'],
  '7': ['###', '..#', '.#.', '.#.', '.#.'],
  '8': ['###', '#.#', '###', '#.#', '###'],
  '9': ['###', '#.#', '###', '..#', '###'],
};

export const GLYPH_W = 3;
export const GLYPH_H = 5;
/** Cells between glyphs. */
export const GLYPH_GAP = 1;

/** Width of a digit string in cells. */
export function textCells(text: string): number {
  return text.length * GLYPH_W + Math.max(0, text.length - 1) * GLYPH_GAP;
}

/** Calls plot(cx, cy) for every inked cell of the text, origin at its top-left. */
export function forEachInkCell(text: string, plot: (cx: number, cy: number) => void): void {
  let x0 = 0;
  for (const ch of text) {
    const g = GLYPHS[ch];
    if (!g) throw new Error(`digit font: no glyph for "${ch}" (digits 0-9 only)`);
    g.forEach((row, cy) => {
      for (let cx = 0; cx < GLYPH_W; cx++) if (row[cx] === '#') plot(x0 + cx, cy);
    });
    x0 += GLYPH_W + GLYPH_GAP;
  }
}
