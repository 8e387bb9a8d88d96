import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describeTemplateIssues, pageTemplateSchema, type PageTemplate } from '../../../shared/contracts/templates';
import { appRoot as printAppRoot } from '../../platform/app-root';

/** A page template file that cannot be used; the message names the file and each field. */
export class TemplateFileError extends Error {
  constructor(
    readonly file: string,
    readonly problems: string[],
  ) {
    super(`page template ${file} is invalid:\n  - ${problems.join('\n  - ')}`);
    this.name = 'TemplateFileError';
  }
}

export function parseTemplateFile(file: string, text: string): PageTemplate {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new TemplateFileError(file, [`not valid JSON: ${(e as Error).message}`]);
  }
  const parsed = pageTemplateSchema.safeParse(raw);
  if (!parsed.success) throw new TemplateFileError(file, describeTemplateIssues(parsed.error));
  const expectedId = file.replace(/^.*[\\/]/, '').replace(/\.json$/, '');
  if (parsed.data.id !== expectedId) {
    throw new TemplateFileError(file, [`id: "${parsed.data.id}" must match the file name "${expectedId}"`]);
  }
  return parsed.data;
}

/**
 * Loads and validates every templates/pages/*.json. Throws one error listing every bad
 * file and field, so start-up fails with the whole picture at once.
 */
export function loadPageTemplates(dir = join(printAppRoot(), 'templates', 'pages')): Map<string, PageTemplate> {
  const files = readdirSync(dir).filter((f) => f.endsWith('.json')).sort();
  const out = new Map<string, PageTemplate>();
  const errors: TemplateFileError[] = [];
  for (const f of files) {
    const rel = `templates/pages/${f}`;
    try {
      const t = parseTemplateFile(rel, readFileSync(join(dir, f), 'utf8'));
      out.set(t.id, t);
    } catch (e) {
      if (e instanceof TemplateFileError) errors.push(e);
      else throw e;
    }
  }
  if (errors.length === 1) throw errors[0];
  if (errors.length > 1) {
    throw new TemplateFileError(
      errors.map((e) => e.file).join(', '),
      errors.flatMap((e) => e.problems.map((p) => `${e.file}: ${p}`)),
    );
  }
  if (out.size === 0) throw new TemplateFileError(`templates/pages`, ['no page templates found (need at least one *.json)']);
  return out;
}

let shipped: Map<string, PageTemplate> | undefined;

/** The shipped templates, loaded once (call at start-up so a bad file stops the server). */
export function pageTemplates(): Map<string, PageTemplate> {
  shipped ??= loadPageTemplates();
  return shipped;
}

export function getPageTemplate(id: string): PageTemplate | undefined {
  return pageTemplates().get(id);
}
