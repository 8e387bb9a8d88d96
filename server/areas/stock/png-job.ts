import { z } from 'zod';
import { tilingSchema } from '../../../shared/contracts/tilings';
import type { Jobs } from '../../platform/jobs/port';
import { renderTilingPng } from '../../platform/images/tiling-png';
import { defineJob } from '../../platform/jobs/types';
import type { Tiling } from '../../../shared/tiling/index';

// Tiling pictures (the stock's images and thumbnails) are drawn on a job worker (compute kind
// 'tiling-png'): 6 to 125 ms each, and a page of the stock asks for 25 at once. The PNG crosses
// back as base64; the stock's routes keep a cache by canonical key.

export const TILING_PNG_KIND = 'tiling-png';

const paramsSchema = z.object({ tiling: tilingSchema, width: z.number().int().min(16).max(4096), labels: z.boolean() });

export const handler = defineJob({
  kind: TILING_PNG_KIND,
  parseParams: (raw) => paramsSchema.parse(raw),
  run(ctx) {
    const { tiling, width, labels } = ctx.params;
    return renderTilingPng(tiling, { width, labels }).toString('base64');
  },
});

/** Draw a tiling as a PNG on a job worker. */
export async function tilingPngOnWorker(jobs: Pick<Jobs, 'compute'>, tiling: Tiling, opts: { width: number; labels: boolean }): Promise<Buffer> {
  const b64 = z.string().parse(await jobs.compute(TILING_PNG_KIND, { tiling, width: opts.width, labels: opts.labels }, { timeoutMs: 60_000 }));
  return Buffer.from(b64, 'base64');
}
