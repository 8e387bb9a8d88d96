import { PNG } from 'pngjs';
import type { Tiling } from '../../shared/tiling/index';
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

/** Renders a tiling as a PNG (RGBA). */
export function renderTilingPng(tiling: Tiling, opts: TilingPngOptions): Buffer {
  const width = opts.width;
  const height = check(tiling, width);
  // Flat colour areas: the "up" row filter with the fastest deflate level stays small and fast (pngjs's
  // default tries every filter on every row).
  const png = new PNG({ width, height, filterType: 2, deflateLevel: 1 });
  const data = png.data;
  const k = width / tiling.W;
  const line = Math.max(1, Math.round(width / 320));

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

  // Ink everywhere, then each square's inside: the lines are what is left between them.
  fill(0, 0, width, height, PNG_PALETTE.ink);
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
    fill(ix0, iy0, ix1, iy1, colour);
    if (opts.labels && !blank) {
      const text = String(q.s);
      const innerW = ix1 - ix0;
      const innerH = iy1 - iy0;
      const cell = Math.floor(Math.min((innerW * 0.5) / textCells(text), (innerH * 0.4) / GLYPH_H));
      if (cell >= 1) {
        const tx = ix0 + Math.floor((innerW - textCells(text) * cell) / 2);
        const ty = iy0 + Math.floor((innerH - GLYPH_H * cell) / 2);
        forEachInkCell(text, (cx, cy) => fill(tx + cx * cell, ty + cy * cell, tx + (cx + 1) * cell, ty + (cy + 1) * cell, PNG_PALETTE.ink));
      }
    }
  });
  return PNG.sync.write(png, { filterType: 2, deflateLevel: 1 });
}
