// Every colour the print layout uses, as the screen sees it (RGB, what @react-pdf/renderer
// writes) and as the press prints it (CMYK, what the press post-processing puts in its
// place). Our ink prints on the black plate only (100% K); tints are CMYK. A colour that is
// not in this table stops the press post-processing with its name, so nothing slips into a
// press file as RGB.

export type Cmyk = readonly [number, number, number, number];

export const PALETTE = {
  /** type, rules, outlines and crop marks: the black plate only */
  ink: { rgb: '#1c1b19', cmyk: [0, 0, 0, 1] },
  /** pure black written by the renderer's own defaults: the black plate only as well */
  black: { rgb: '#000000', cmyk: [0, 0, 0, 1] },
  paper: { rgb: '#ffffff', cmyk: [0, 0, 0, 0] },
  pieceFill: { rgb: '#e9e2d3', cmyk: [0, 0.03, 0.1, 0.08] },
  starterFill: { rgb: '#c9b48a', cmyk: [0, 0.1, 0.32, 0.22] },
  givenFill: { rgb: '#f3efe6', cmyk: [0, 0.01, 0.05, 0.04] },
  /** the PROOF watermark of a proof: a light tint of black, under the content */
  proofTint: { rgb: '#dededd', cmyk: [0, 0, 0, 0.14] },
} as const satisfies Record<string, { rgb: string; cmyk: Cmyk }>;

export const INK = PALETTE.ink.rgb;

function rgbKey(r: number, g: number, b: number): string {
  const h = (v: number) =>
    Math.round(Math.min(1, Math.max(0, v)) * 255)
      .toString(16)
      .padStart(2, '0');
  return `#${h(r)}${h(g)}${h(b)}`;
}

const byRgb = new Map<string, Cmyk>(Object.values(PALETTE).map((c) => [c.rgb, c.cmyk]));

/** The press colour of an RGB colour (components 0..1) the layout wrote; throws for one not in the palette. */
export function pressColourOf(r: number, g: number, b: number): Cmyk {
  const key = rgbKey(r, g, b);
  const cmyk = byRgb.get(key);
  if (!cmyk) throw new Error(`print: the colour ${key} is not in the print palette (server/areas/print/palette.ts); add it with its CMYK`);
  return cmyk;
}

/** The press colour of a grey level (0 = black .. 1 = white): a tint of the black plate. */
export function pressGreyOf(level: number): Cmyk {
  return [0, 0, 0, Math.round((1 - level) * 10000) / 10000];
}
