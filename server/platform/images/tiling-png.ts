import { PNG } from 'pngjs';
import type { Tiling } from '../../../shared/tiling/index';
import { forEachInkCell, GLYPH_H, textCells } from './digit-font';

// PNG images of tilings for the web (stock pages, thumbnails, puzzle previews), drawn
// pixel by pixel into pngjs's RGBA buffer: no native image library.

export type Rgb = readonly [number, number, number];

/** Our palette: paper, ink and five muted fills (by size rank, largest first). */
export const PNG_PALETTE = {
  paper: [0xfb, 0xf9, 0xf4] as Rgb,
  ink: [0x1c, 0x1b, 0x19] as Rgb,
  fills: [
    [0xe9, 0xe2, 0xd3],
    [0xd8, 0xc7, 0x9f],
    [0xb9, 0xc8, 0xb4],
    [0xc6, 0xd0, 0xdc],
    [0xe2, 0xc4, 0xb4],
  ] as Rgb[],
} as const;

export const PNG_SIZES = { web: 640, web2x: 1280, thumbnail: 160, thumbnail2x: 320 } as const;
export const MAX_PNG_SIDE = 4096;

export type TilingPngOptions = {
  /** Image width in pixels; the height follows the tiling's aspect ratio. */
  width: number;
  /** Draw each square's size where it fits (tiny built-in digit font). */
  labels?: boolean;
  /** Squares to leave blank (white, no label), by index: e.g. the unknowns of a puzzle. */
  blank?: ReadonlySet<number>;
};

export class TilingImageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'TilingImageError';
  }
}

/** The fill colour of square i: by the rank of its size among the distinct sizes. */
export function fillFor(tiling: Tiling, i: number): Rgb {
  const sizes = [...new Set(tiling.squares.map((q) => q.s))].sort((a, b) => b - a);
  const rank = sizes.indexOf(tiling.squares[i]?.s ?? -1);
  return PNG_PALETTE.fills[Math.max(0, rank) % PNG_PALETTE.fills.length] ?? PNG_PALETTE.fills[0]!;
}

function check(tiling: Tiling, width: number): number {
  if (!Number.isInteger(width) || width < 8 || width > MAX_PNG_SIDE) throw new TilingImageError(`width must be a whole number of pixels from 8 to ${MAX_PNG_SIDE}, got ${width}`);
  const { W, H, squares } = tiling;
  if (!Number.isInteger(W) || !Number.isInteger(H) || W <= 0 || H <= 0) throw new TilingImageError(`tiling size must be positive whole numbers, got ${W} x ${H}`);
  const height = Math.max(1, Math.round((width * H) / W));
  if (height > MAX_PNG_SIDE) throw new TilingImageError(`image would be ${width} x ${height} pixels; a side may be at most ${MAX_PNG_SIDE}`);
  squares.forEach((q, i) => {
    if (!Number.isInteger(q.s) || q.s <= 0 || q.x < 0 || q.y < 0 || q.x + q.s > W || q.y + q.s > H) {
      throw new TilingImageError(`square ${i + 1} (side ${q.s} at ${q.x},${q.y}) does not lie inside the ${W} x ${H} rectangle`);
    }
  });
  return height;
}

/** One filled box of an image, in the picture's own units. */
export type PngBox = { x: number; y: number; w: number; h: number; fill: Rgb; label?: string | undefined };

type Canvas = { png: PNG; width: number; height: number; line: number; fill: (x0: number, y0: number, x1: number, y1: number, c: Rgb) => void; label: (text: string, ix0: number, iy0: number, ix1: number, iy1: number) => void };

function canvas(width: number, height: number): Canvas {
  // Flat colour areas: the "up" row filter with the fastest deflate level stays small and
  // fast (pngjs's default tries every filter on every row).
  const png = new PNG({ width, height, filterType: 2, deflateLevel: 1 });
  const data = png.data;
  // One 32-bit word per pixel (RGBA bytes in memory order): rows are filled with
  // TypedArray.fill instead of byte by byte.
  const words = new Uint32Array(data.buffer, data.byteOffset, width * height);
  const little = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;
  const word = (c: Rgb) => (little ? ((255 << 24) | (c[2] << 16) | (c[1] << 8) | c[0]) >>> 0 : ((c[0] << 24) | (c[1] << 16) | (c[2] << 8) | 255) >>> 0);
  const fill = (x0: number, y0: number, x1: number, y1: number, c: Rgb) => {
    const xa = Math.max(0, x0);
    const xb = Math.min(width, x1);
    const ya = Math.max(0, y0);
    const yb = Math.min(height, y1);
    if (xb <= xa) return;
    const w = word(c);
    for (let y = ya; y < yb; y++) words.fill(w, y * width + xa, y * width + xb);
  };
  const label = (text: string, ix0: number, iy0: number, ix1: number, iy1: number) => {
    const innerW = ix1 - ix0;
    const innerH = iy1 - iy0;
    const cell = Math.floor(Math.min((innerW * 0.5) / textCells(text), (innerH * 0.4) / GLYPH_H));
    if (cell < 1) return;
    const tx = ix0 + Math.floor((innerW - textCells(text) * cell) / 2);
    const ty = iy0 + Math.floor((innerH - GLYPH_H * cell) / 2);
    forEachInkCell(text, (cx, cy) => fill(tx + cx * cell, ty + cy * cell, tx + (cx + 1) * cell, ty + (cy + 1) * cell, PNG_PALETTE.ink));
  };
  return { png, width, height, line: Math.max(1, Math.round(width / 320)), fill, label };
}

const write = (c: Canvas) => PNG.sync.write(c.png, { filterType: 2, deflateLevel: 1 });

/** Renders a tiling as a PNG (RGBA). */
export function renderTilingPng(tiling: Tiling, opts: TilingPngOptions): Buffer {
  const width = opts.width;
  const height = check(tiling, width);
  const c = canvas(width, height);
  const { line } = c;
  const k = width / tiling.W;
  // Ink everywhere, then each square's inside: the lines are what is left between them.
  c.fill(0, 0, width, height, PNG_PALETTE.ink);
  const sizes = [...new Set(tiling.squares.map((q) => q.s))].sort((a, b) => b - a);
  const rankOf = new Map(sizes.map((s, i) => [s, i]));
  tiling.squares.forEach((q, i) => {
    const x0 = Math.round(q.x * k);
    const y0 = Math.round(q.y * k);
    const x1 = Math.round((q.x + q.s) * k);
    const y1 = Math.round((q.y + q.s) * k);
    const blank = opts.blank?.has(i) ?? false;
    const colour = blank ? ([255, 255, 255] as Rgb) : (PNG_PALETTE.fills[(rankOf.get(q.s) ?? 0) % PNG_PALETTE.fills.length] ?? PNG_PALETTE.fills[0]!);
    const ix0 = x0 + line;
    const iy0 = y0 + line;
    const ix1 = x1 === width ? x1 - line : x1;
    const iy1 = y1 === height ? y1 - line : y1;
    c.fill(ix0, iy0, ix1, iy1, colour);
    if (opts.labels && !blank) c.label(String(q.s), ix0, iy0, ix1, iy1);
  });
  return write(c);
}

/**
 * A picture of boxes on white inside a W x H frame: a Deduction layout (not to scale, givens
 * labelled) or an Assembly frame with its starter pieces. Boxes are outlined in ink.
 */
export function renderBoxesPng(frame: { W: number; H: number }, boxes: readonly PngBox[], width: number): Buffer {
  const height = check({ W: frame.W, H: frame.H, squares: [] }, width);
  boxes.forEach((b, i) => {
    if (!(b.w > 0 && b.h > 0 && b.x >= 0 && b.y >= 0 && b.x + b.w <= frame.W && b.y + b.h <= frame.H)) {
      throw new TilingImageError(`box ${i + 1} (${b.w} x ${b.h} at ${b.x},${b.y}) does not lie inside the ${frame.W} x ${frame.H} frame`);
    }
  });
  const c = canvas(width, height);
  const { line } = c;
  const kx = width / frame.W;
  const ky = height / frame.H;
  c.fill(0, 0, width, height, PNG_PALETTE.ink);
  c.fill(line, line, width - line, height - line, [255, 255, 255]);
  for (const b of boxes) {
    const x0 = Math.round(b.x * kx);
    const y0 = Math.round(b.y * ky);
    const x1 = Math.round((b.x + b.w) * kx);
    const y1 = Math.round((b.y + b.h) * ky);
    c.fill(x0, y0, x1, y1, PNG_PALETTE.ink);
    const ix0 = x0 + line;
    const iy0 = y0 + line;
    const ix1 = x1 - line;
    const iy1 = y1 - line;
    c.fill(ix0, iy0, ix1, iy1, b.fill);
    if (b.label) c.label(b.label, ix0, iy0, ix1, iy1);
  }
  return write(c);
}

/** A Deduction puzzle for the web: the not-to-scale layout with its givens. */
export function renderDeductionPng(layout: { W: number; H: number; rects: readonly { x: number; y: number; w: number; h: number }[] }, givens: readonly { rect: number; size: number }[], width: number): Buffer {
  const shown = new Map(givens.map((g) => [g.rect, g.size]));
  return renderBoxesPng(
    layout,
    layout.rects.map((r, i) => ({ ...r, fill: shown.has(i) ? PNG_PALETTE.fills[0]! : ([255, 255, 255] as Rgb), label: shown.has(i) ? String(shown.get(i)) : undefined })),
    width,
  );
}

/** An Assembly puzzle for the web: the empty frame with its starter pieces placed. */
export function renderAssemblyPng(frame: { W: number; H: number }, starters: readonly { size: number; x: number; y: number }[], width: number): Buffer {
  return renderBoxesPng(frame, starters.map((s) => ({ x: s.x, y: s.y, w: s.size, h: s.size, fill: PNG_PALETTE.fills[1]!, label: String(s.size) })), width);
}
