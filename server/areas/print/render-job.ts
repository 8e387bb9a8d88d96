import { z } from 'zod';
import { preflightSchema } from '../../../shared/contracts/preflight';
import type { Jobs } from '../../platform/jobs/port';
import { defineJob } from '../../platform/jobs/types';
import { renderEditionPdf, warmPrint, type RenderOptions } from './render-edition';
import { editionDocumentSchema, type EditionDocument, type RenderResult } from './types';

// Proof, preview, press-file and sample renders run on a job worker (a compute job, kind
// 'print-render'), never on the thread that answers requests: @react-pdf/renderer takes 0.8 to
// 4.6 s of CPU per edition. The worker runs the very same renderEditionPdf (./render-edition.ts);
// the file crosses back as base64 (it may come through Redis from another machine).

export const PRINT_RENDER_KIND = 'print-render';

const renderOptionsSchema = z.object({
  stamp: z.enum(['PROOF']).nullable(),
  proofVersion: z.number().int().optional(),
  createdAt: z.string().optional(),
  outputProfile: z.object({ base64: z.string(), description: z.string() }).optional(),
}) satisfies z.ZodType<RenderOptions>;

const paramsSchema = z.union([
  z.object({ warm: z.literal(true) }),
  z.object({ doc: editionDocumentSchema, opts: renderOptionsSchema }),
]);

const renderedSchema = z.object({ pdf: z.string(), pages: z.number().int(), preflight: preflightSchema });

export const handler = defineJob({
  kind: PRINT_RENDER_KIND,
  parseParams: (raw) => paramsSchema.parse(raw),
  async run(ctx) {
    const p = ctx.params;
    if ('warm' in p) {
      await warmPrint();
      return { warm: true };
    }
    const r = await renderEditionPdf(p.doc, p.opts);
    return { pdf: r.pdf.toString('base64'), pages: r.pages, preflight: r.preflight };
  },
});

/** Render an edition on a job worker; the request's thread waits without working. */
export async function renderOnWorker(jobs: Pick<Jobs, 'compute'>, doc: EditionDocument, opts: RenderOptions): Promise<RenderResult> {
  const raw = await jobs.compute(PRINT_RENDER_KIND, { doc, opts }, { timeoutMs: 180_000 });
  const r = renderedSchema.parse(raw);
  return { pdf: Buffer.from(r.pdf, 'base64'), pages: r.pages, preflight: r.preflight };
}

/** Load the PDF renderer and its fonts on a worker ahead of the first proof. */
export function warmPrintOnWorker(jobs: Pick<Jobs, 'compute'>): Promise<unknown> {
  return jobs.compute(PRINT_RENDER_KIND, { warm: true }, { timeoutMs: 180_000 });
}

