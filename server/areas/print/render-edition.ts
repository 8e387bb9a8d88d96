import { type PressSettings } from '../../../shared/contracts/press';
import { templatePressDefaults } from '../../../shared/contracts/templates';
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

const PT_PER_MM = 72 / 25.4;

/** The plant's output profile (ICC), base64 so the options stay JSON (they may cross to a worker). */
export type OutputProfile = { base64: string; description: string };

export type RenderOptions = LayoutOptions & {
  /** when the file is made: its Info and XMP dates (ISO date-time; default now) */
  createdAt?: string | undefined;
  /** the output profile embedded for PDF/X-4 (the press settings name it by SHA-256) */
  outputProfile?: OutputProfile | undefined;
};

/** The press settings an edition document prints with: its own, or (documents stored before PDF/X) the template's defaults. */
export function pressSettingsOf(doc: Pick<EditionDocument, 'press' | 'template'>): PressSettings {
  return doc.press ?? { ...templatePressDefaults(doc.template), profileSha256: null };
}

/**
 * Renders an edition to a PDF/X file (proof or press file) with its preflight report: the
 * layout, then the press post-processing (pdfx.ts), then the preflight of the finished bytes.
 */
export async function renderEditionPdf(doc: EditionDocument, opts: RenderOptions): Promise<RenderResult> {
  const [layout, renderer] = await loadLayout();
  const { preflightPdf } = await import('./preflight');
  const { toPdfX } = await import('./pdfx');
  const press = pressSettingsOf(doc);
  // the press spec's bleed replaces the template's
  const template = { ...doc.template, bleedMm: press.bleedMm };
  const built = layout.buildEditionLayout({ ...doc, template }, opts);
  const raw = await renderer.renderToBuffer(built.element as Parameters<typeof renderer.renderToBuffer>[0]);
  const title = `${doc.publicationTitle} No. ${doc.editionNumber}${opts.stamp === 'PROOF' ? ` (proof${opts.proofVersion ? ` v${opts.proofVersion}` : ''})` : ''}`;
  const pdf = await toPdfX(raw, {
    press,
    trimPt: { width: template.trim.widthMm * PT_PER_MM, height: template.trim.heightMm * PT_PER_MM },
    bleedPt: press.bleedMm * PT_PER_MM,
    title,
    createdAt: opts.createdAt ? new Date(opts.createdAt) : new Date(),
    profile: opts.outputProfile ? { bytes: Buffer.from(opts.outputProfile.base64, 'base64'), description: opts.outputProfile.description } : undefined,
  });
  const preflight = await preflightPdf({ template, press, pdf, fontsRegistered: built.fonts, pageSizePt: built.pageSizePt, metrics: built.metrics });
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
