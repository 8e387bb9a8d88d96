import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { fillFor, PNG_PALETTE, renderTilingPng, TilingImageError } from '../../../server/platform/images/tiling-png';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';

function pixel(png: PNG, x: number, y: number): [number, number, number, number] {
  const o = (png.width * y + x) * 4;
  return [png.data[o]!, png.data[o + 1]!, png.data[o + 2]!, png.data[o + 3]!];
}

describe('tiling PNG', () => {
  it('decodes (PNG signature, pngjs) with the asked width and the tiling aspect ratio', () => {
    const buf = renderTilingPng(TILING_33x32, { width: 330 });
    // PNG signature: 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948, section 5.2)
    expect([...buf.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const png = PNG.sync.read(buf);
    expect(png.width).toBe(330);
    expect(png.height).toBe(320);
  });

  it('fills each square centre with its palette colour and inks the edges', () => {
    const k = 10;
    const png = PNG.sync.read(renderTilingPng(TILING_33x32, { width: 33 * k }));
    TILING_33x32.squares.forEach((q, i) => {
      const cx = Math.floor((q.x + q.s / 2) * k);
      const cy = Math.floor((q.y + q.s / 2) * k);
      expect(pixel(png, cx, cy), `centre of square ${q.s}`).toEqual([...fillFor(TILING_33x32, i), 255]);
      // the left and top edges of every square are ink
      expect(pixel(png, q.x * k, cy), `left edge of ${q.s}`).toEqual([...PNG_PALETTE.ink, 255]);
      expect(pixel(png, cx, q.y * k), `top edge of ${q.s}`).toEqual([...PNG_PALETTE.ink, 255]);
    });
    // the outer frame: right and bottom pixel columns are ink
    expect(pixel(png, 33 * k - 1, 5)).toEqual([...PNG_PALETTE.ink, 255]);
    expect(pixel(png, 5, 32 * k - 1)).toEqual([...PNG_PALETTE.ink, 255]);
  });

  it('gives distinct sizes next to each other different colours where the palette allows', () => {
    // 18 and 15 are the two largest sizes: ranks 0 and 1 of the palette
    expect(fillFor(TILING_33x32, 0)).not.toEqual(fillFor(TILING_33x32, 1));
  });

  it('draws size labels in ink when asked, and none otherwise', () => {
    const k = 10;
    const count = (labels: boolean) => {
      const png = PNG.sync.read(renderTilingPng(TILING_69x61, { width: 69 * k, labels }));
      const q = TILING_69x61.squares[0]!; // the 36 at (0,0)
      let ink = 0;
      for (let y = q.y * k + 4; y < (q.y + q.s) * k - 4; y++) {
        for (let x = q.x * k + 4; x < (q.x + q.s) * k - 4; x++) if (pixel(png, x, y)[0] === PNG_PALETTE.ink[0]) ink++;
      }
      return ink;
    };
    expect(count(false)).toBe(0);
    expect(count(true)).toBeGreaterThan(50);
  });

  it('leaves blank squares white', () => {
    const png = PNG.sync.read(renderTilingPng(TILING_33x32, { width: 330, blank: new Set([2]) }));
    const q = TILING_33x32.squares[2]!;
    expect(pixel(png, (q.x + q.s / 2) * 10, (q.y + q.s / 2) * 10)).toEqual([255, 255, 255, 255]);
  });

  it('refuses bad sizes and squares outside the rectangle with a clear message', () => {
    expect(() => renderTilingPng(TILING_33x32, { width: 0 })).toThrowError(TilingImageError);
    expect(() => renderTilingPng(TILING_33x32, { width: 5000 })).toThrowError(/from 8 to 4096, got 5000/);
    expect(() => renderTilingPng({ W: 10, H: 10, squares: [{ x: 5, y: 5, s: 6 }] }, { width: 100 })).toThrowError(/square 1 \(side 6 at 5,5\) does not lie inside the 10 x 10 rectangle/);
    expect(() => renderTilingPng({ W: 1, H: 1000, squares: [] }, { width: 100 })).toThrowError(/a side may be at most 4096/);
  });
});

describe('puzzle PNGs', () => {
  it('draws a Deduction layout with its givens labelled and the rest blank', async () => {
    const { renderDeductionPng } = await import('../../../server/platform/images/tiling-png');
    const { notToScale } = await import('../print/fixtures/sample-edition');
    const layout = notToScale(TILING_33x32);
    const png = PNG.sync.read(renderDeductionPng(layout, [{ rect: 0, size: 18 }], layout.W * 20));
    const centre = (i: number) => {
      const r = layout.rects[i]!;
      return [Math.floor((r.x + r.w / 2) * 20), Math.floor((r.y + r.h * 0.15) * 20)] as const;
    };
    expect(pixel(png, ...centre(0))).toEqual([...PNG_PALETTE.fills[0]!, 255]);
    expect(pixel(png, ...centre(1))).toEqual([255, 255, 255, 255]);
    // the frame's outer edge is ink
    expect(pixel(png, 0, 0)).toEqual([...PNG_PALETTE.ink, 255]);
  });

  it('draws an Assembly frame with its starter pieces and refuses one outside', async () => {
    const { renderAssemblyPng } = await import('../../../server/platform/images/tiling-png');
    const png = PNG.sync.read(renderAssemblyPng({ W: 69, H: 61 }, [{ size: 36, x: 0, y: 0 }], 690));
    expect(pixel(png, 100, 340)).toEqual([...PNG_PALETTE.fills[1]!, 255]); // inside the 36 at (0,0)
    expect(pixel(png, 500, 500)).toEqual([255, 255, 255, 255]); // empty frame
    expect(() => renderAssemblyPng({ W: 10, H: 10 }, [{ size: 6, x: 5, y: 0 }], 100)).toThrowError(/box 1 \(6 x 6 at 5,0\) does not lie inside the 10 x 10 frame/);
  });
});
