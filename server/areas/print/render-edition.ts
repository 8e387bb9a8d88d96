import type { LayoutOptions } from './edition-layout';
import type { EditionDocument, RenderResult } from './types';

// @react-pdf/renderer costs about a second to import, so the layout module (which imports
// it) is loaded on first use only; later renders reuse the loaded module.
let layoutModule: Promise<typeof import('./edition-layout')> | undefined;
let rendererModule: Promise<typeof import('@react-pdf/renderer')> | undefined;

function loadLayout() {
  layoutModule ??= import('./edition-layout');
  rendererModule ??= import('@react-pdf/renderer');
  return Promise.all([layoutModule, rendererModule]);
}

export type RenderOptions = LayoutOptions;

/** Renders an edition to PDF with its preflight report. */
export async function renderEditionPdf(doc: EditionDocument, opts: RenderOptions): Promise<RenderResult> {
  const [layout, renderer] = await loadLayout();
  const { preflightPdf } = await import('./preflight');
  const built = layout.buildEditionLayout(doc, opts);
  const pdf = await renderer.renderToBuffer(built.element as Parameters<typeof renderer.renderToBuffer>[0]);
  const preflight = preflightPdf({ template: doc.template, pdf, fontsRegistered: built.fonts, pageSizePt: built.pageSizePt, metrics: built.metrics });
  return { pdf, pages: preflight.pages, preflight };
}

/**
 * Loads the PDF modules and registers the fonts ahead of the first proof (call after the
 * server listens; still lazy: nothing is loaded at import time).
 */
export async function warmPrint(): Promise<void> {
  const [layout] = await loadLayout();
  layout.registerPrintFonts(layout.Font);
}
