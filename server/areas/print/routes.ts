import { z } from 'zod';
import { templateGeometry, templateListResponseSchema } from '../../../shared/contracts/templates';
import type { PlatformDeps } from '../../platform/deps';
import { NotFound } from '../../platform/http/errors';
import { route, type ApiRouter } from '../../platform/http/route';
import { renderOnWorker, warmPrintOnWorker } from './render-job';
import { templateSampleEdition } from './sample-edition';
import { pageTemplates } from './templates';

export function registerTemplateRoutes(router: ApiRouter, deps: PlatformDeps) {
  const tags = ['templates'];
  // Loading here makes a bad template file stop the server at start-up, naming file and field.
  pageTemplates();
  // In production, load the PDF renderer on a job thread shortly after start-up so the first
  // proof does not wait for it (about a second of import); tests and development stay lazy.
  if (deps.env.NODE_ENV === 'production' && deps.jobs.mode === 'threads') {
    setTimeout(() => {
      warmPrintOnWorker(deps.jobs).catch((e: unknown) => deps.log.warn(`print: could not preload the PDF renderer: ${(e as Error).message}`));
    }, 3_000).unref();
  }

  route(
    router,
    { method: 'GET', path: '/api/templates', summary: 'The page templates (templates/pages) with their page sizes', tags, response: templateListResponseSchema },
    () => ({
      templates: [...pageTemplates().values()].map((t) => {
        const g = templateGeometry(t);
        return { template: t, pageWidthMm: g.pageWidthMm, pageHeightMm: g.pageHeightMm, columnWidthMm: g.columnWidthMm };
      }),
    }),
  );

  route(
    router,
    {
      method: 'GET',
      path: '/api/templates/:id/sample.pdf',
      summary: 'A sample page of a template, with layout samples from the foundry',
      tags,
      params: z.object({ id: z.string().min(1).max(100) }),
      produces: 'application/pdf',
    },
    async ({ params, res }) => {
      const t = pageTemplates().get(params.id);
      if (!t) throw new NotFound(`No page template ${params.id}.`);
      const r = await renderOnWorker(deps.jobs, templateSampleEdition(t), { stamp: null });
      res.status(200).type('application/pdf').setHeader('Content-Disposition', `inline; filename="sample-${t.id}.pdf"`);
      res.send(r.pdf);
    },
  );
}
