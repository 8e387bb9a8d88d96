// Our palette for tilings: paper-toned fills, ink outlines, one warm accent for highlights.
export const tilingPalette = {
  fills: ['#e9dfc9', '#cfdac8', '#dcc7b8', '#c5d0dc', '#e6d6a8', '#d2c6da', '#c9dcd6', '#e2cbc4'],
  ink: '#23262d',
  paper: '#fbfaf6',
  accent: '#c8642b',
  accentFill: '#f2c7a5',
  muted: '#7a7f88',
} as const;

/** The SVG text attributes of the numbers on a drawing (square sizes, currents): ink, tabular figures. */
export const numberLabelProps = {
  fill: tilingPalette.ink,
  style: { fontVariantNumeric: 'tabular-nums', fontFamily: 'var(--font-sans, sans-serif)' },
} as const;

/** A fill for a square, stable for a given size so equal sizes share a colour. */
export function fillForSize(size: number): string {
  const fills = tilingPalette.fills;
  // Knuth's multiplicative hash spreads consecutive sizes over the palette (common practice).
  const h = Math.imul(size, 2654435761) >>> 0;
  return fills[h % fills.length] ?? fills[0];
}
