// The print area's public face: page templates, the edition document (its types and the
// schema a stored copy is parsed with), and the renderer (PDF with its preflight). The
// editions area prints through these.
export { registerTemplateRoutes } from './routes';
export { renderEditionPdf, warmPrint, pressSettingsOf, type OutputProfile, type RenderOptions } from './render-edition';
export { buildLayoutPackage, instructionsText, solutionText, type Manifest, type PackageEntry } from './layout-package';
export { renderOnWorker, warmPrintOnWorker } from './render-job';
export { layoutPackageOnWorker } from './layout-package-job';
export { getPageTemplate, pageTemplates } from './templates';
export { editionDocumentSchema } from './types';
export type { EditionDocument, LayoutRect, PuzzlePrint, RenderResult, SolutionPrint, SolvedTiling } from './types';
