import { z } from 'zod';
import { pressSettingsSchema } from '../../../shared/contracts/press';
import type { Jobs } from '../../platform/jobs/port';
import { defineJob } from '../../platform/jobs/types';
import { buildLayoutPackage, type PackageInput } from './layout-package';
import { editionDocumentSchema } from './types';

// The layout package (two PDF/X files and two SVGs per puzzle, zipped) is built on a job worker
// (compute kind 'print-layout-package'), never on the thread that answers requests: it renders
// two PDFs per puzzle, seconds for an edition. The worker runs the very same buildLayoutPackage
// (./layout-package.ts); the zip crosses back as base64 (it may come through Redis).

export const LAYOUT_PACKAGE_KIND = 'print-layout-package';

const doc = editionDocumentSchema.shape;
const paramsSchema = z.object({
  title: z.string(),
  template: doc.template,
  press: pressSettingsSchema,
  outputProfile: z.object({ base64: z.string(), description: z.string() }).optional(),
  createdAt: z.iso.datetime(),
  entries: z.array(z.object({ stem: z.string(), slot: z.number().int().nullable(), puzzleId: z.string(), puzzle: doc.puzzles.element, solution: doc.solutions.element })),
});

export const handler = defineJob({
  kind: LAYOUT_PACKAGE_KIND,
  parseParams: (raw) => paramsSchema.parse(raw),
  async run(ctx) {
    const { zip } = await buildLayoutPackage({ ...ctx.params, createdAt: new Date(ctx.params.createdAt) });
    return { zip: zip.toString('base64') };
  },
});

const builtSchema = z.object({ zip: z.string() });

/** Build a layout package on a job worker; the request's thread waits without working. */
export async function layoutPackageOnWorker(jobs: Pick<Jobs, 'compute'>, input: PackageInput): Promise<{ zip: Buffer }> {
  const raw = await jobs.compute(LAYOUT_PACKAGE_KIND, { ...input, createdAt: input.createdAt.toISOString() }, { timeoutMs: 180_000 });
  return { zip: Buffer.from(builtSchema.parse(raw).zip, 'base64') };
}
