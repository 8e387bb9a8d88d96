import type { PageTemplate } from '../../../shared/contracts/templates';
import type { LayoutMetrics } from './edition-layout';
import type { Preflight, PreflightWarning } from './types';

/** Counts the page objects of a PDF (pdfkit writes page dictionaries uncompressed). */
export function countPdfPages(pdf: Buffer): number {
  const text = pdf.toString('latin1');
  return (text.match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

/** Counts embedded TrueType font programs (/FontFile2 entries of font descriptors). */
export function countEmbeddedFontFiles(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/FontFile2\s+\d+\s+\d+\s+R/g) ?? []).length;
}

/**
 * Names of fonts used without an embedded program: simple Type 1 font dictionaries (the
 * standard 14, e.g. Helvetica) carry no font file (PDF 32000-1, 9.6.2.2).
 */
export function unembeddedFontNames(pdf: Buffer): string[] {
  const text = pdf.toString('latin1');
  const names = new Set<string>();
  for (const m of text.matchAll(/<<([^<>]*)>>/g)) {
    const dict = m[1] ?? '';
    if (!/\/Type\s*\/Font\b/.test(dict) || !/\/Subtype\s*\/Type1\b/.test(dict)) continue;
    const name = /\/BaseFont\s*\/([^\s/<>[\]]+)/.exec(dict)?.[1];
    if (name) names.add(name);
  }
  return [...names];
}

/** The MediaBox (width, height in pt) of every page object. */
export function pageSizes(pdf: Buffer): { width: number; height: number }[] {
  const text = pdf.toString('latin1');
  return [...text.matchAll(/\/MediaBox\s*\[\s*([-\d.]+)\s+([-\d.]+)\s+([-\d.]+)\s+([-\d.]+)\s*\]/g)].map((m) => ({
    width: Number(m[3]) - Number(m[1]),
    height: Number(m[4]) - Number(m[2]),
  }));
}

export type PreflightInput = {
  template: PageTemplate;
  pdf: Buffer;
  fontsRegistered: string[];
  pageSizePt: { width: number; height: number };
  metrics: LayoutMetrics;
};

/**
 * The preflight report of one PDF. Errors make `ok` false (a proof must not go out);
 * warnings are for the editor to weigh. The floors come from the template's `minimums`,
 * which in the shipped templates are common practice for print (digits >= 6 pt,
 * squares >= 3 mm).
 */
export function preflightPdf(input: PreflightInput): Preflight {
  const { template: t, pdf, metrics } = input;
  const pages = countPdfPages(pdf);
  const embeddedFontFiles = countEmbeddedFontFiles(pdf);
  const unembedded = unembeddedFontNames(pdf);
  const fontsEmbedded = embeddedFontFiles > 0 && unembedded.length === 0;
  const errors: PreflightWarning[] = [];
  const warnings: PreflightWarning[] = [];
  if (!fontsEmbedded) {
    errors.push({
      code: 'fonts-not-embedded',
      message: unembedded.length > 0 ? `fonts used without embedding: ${unembedded.join(', ')}` : 'no embedded font program found in the file',
    });
  }
  if (pages === 0) errors.push({ code: 'no-pages', message: 'the file has no pages' });
  // Page size must be trim + 2 x bleed on every page (0.5 pt tolerance for rounding).
  const wrong = pageSizes(pdf).filter((p) => Math.abs(p.width - input.pageSizePt.width) > 0.5 || Math.abs(p.height - input.pageSizePt.height) > 0.5);
  if (wrong.length > 0) {
    errors.push({ code: 'page-size', message: `${wrong.length} page(s) are ${wrong[0]!.width.toFixed(1)} x ${wrong[0]!.height.toFixed(1)} pt, not trim + bleed (${input.pageSizePt.width.toFixed(1)} x ${input.pageSizePt.height.toFixed(1)} pt)` });
  }
  for (const g of metrics.illegibleGivens) {
    errors.push({ code: 'given-illegible', message: `puzzle ${g.slot}: the given ${g.size} cannot be printed at ${t.minimums.digitPt} pt or more in its box` });
  }
  // Floors are errors (a proof must not go out below them); common practice: squares under
  // about 3 mm are hard to see and to cut out
  if (metrics.smallestSquareMm !== null && metrics.smallestSquareMm < t.minimums.squareMm) {
    errors.push({ code: 'square-small', message: `smallest printed square is ${metrics.smallestSquareMm.toFixed(2)} mm, under the ${t.minimums.squareMm} mm minimum` });
  }
  // common practice: digits under about 6 pt are not legible in print
  if (metrics.smallestDigitPt !== null && metrics.smallestDigitPt < t.minimums.digitPt) {
    errors.push({ code: 'digit-small', message: `smallest digit is ${metrics.smallestDigitPt.toFixed(1)} pt, under the ${t.minimums.digitPt} pt minimum` });
  }
  const omitted = metrics.omittedLabels;
  if (omitted.length > 0) {
    const inPuzzles = omitted.filter((o) => o.where === 'puzzle');
    const inSolutions = omitted.filter((o) => o.where === 'solution');
    const describe = (list: typeof omitted) =>
      [...new Set(list.map((o) => o.slot))].map((slot) => `puzzle ${slot} (${list.filter((o) => o.slot === slot).map((o) => o.size).join(', ')})`).join('; ');
    if (inPuzzles.length > 0) warnings.push({ code: 'labels-omitted', message: `${inPuzzles.length} piece labels left out, too small to print at ${t.minimums.digitPt} pt: ${describe(inPuzzles)}` });
    if (inSolutions.length > 0) warnings.push({ code: 'solution-labels-omitted', message: `${inSolutions.length} solution labels left out, too small to print at ${t.minimums.digitPt} pt: ${describe(inSolutions)}` });
  }
  const r1 = (v: number) => Math.round(v * 10) / 10;
  return {
    ok: errors.length === 0,
    templateId: t.id,
    pages,
    trimMm: { width: t.trim.widthMm, height: t.trim.heightMm },
    bleedMm: t.bleedMm,
    pageSizePt: { width: r1(input.pageSizePt.width), height: r1(input.pageSizePt.height) },
    fontsRegistered: input.fontsRegistered,
    embeddedFontFiles,
    fontsEmbedded,
    smallestSquareMm: metrics.smallestSquareMm === null ? null : Math.round(metrics.smallestSquareMm * 100) / 100,
    smallestDigitPt: metrics.smallestDigitPt,
    omittedLabels: omitted,
    warnings: [...errors.map((e) => ({ ...e, code: `error:${e.code}` })), ...warnings],
  };
}
