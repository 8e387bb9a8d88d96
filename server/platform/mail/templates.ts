import { readdirSync, readFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { fromRoot } from '../app-root';

// Mail templates live in templates/mail/<name>.txt:
//   Subject: <subject with {{placeholders}}>
//   <blank line>
//   <body with {{placeholders}}>
// Placeholders are letters, digits and underscores. Every template is parsed at start-up.

export type MailTemplate = { name: string; subject: string; body: string; placeholders: string[] };

const placeholderPattern = /\{\{\s*([A-Za-z_][A-Za-z0-9_]*)\s*\}\}/g;

export function parseMailTemplate(name: string, source: string): MailTemplate {
  const text = source.replace(/\r\n/g, '\n');
  const match = /^Subject: *(.+)\n\n([\s\S]+)$/.exec(text);
  if (!match || !match[1] || !match[2]) {
    throw new Error(`mail template "${name}": must start with "Subject: ..." then a blank line, then the body`);
  }
  const subject = match[1].trim();
  const body = match[2];
  const open = (text.match(/\{\{/g) ?? []).length;
  const found = [...text.matchAll(placeholderPattern)];
  if (open !== found.length) {
    throw new Error(`mail template "${name}": a "{{" does not start a valid {{placeholder}}`);
  }
  const placeholders = [...new Set(found.map((m) => m[1] as string))].sort();
  return { name, subject, body, placeholders };
}

let cache: Map<string, MailTemplate> | undefined;

/** Load and validate every template in templates/mail (cached). Throws on the first bad one. */
export function loadMailTemplates(folder = fromRoot('templates', 'mail')): Map<string, MailTemplate> {
  if (cache && folder === fromRoot('templates', 'mail')) return cache;
  const map = new Map<string, MailTemplate>();
  for (const file of readdirSync(folder).filter((f) => f.endsWith('.txt')).sort()) {
    const name = basename(file, '.txt');
    map.set(name, parseMailTemplate(name, readFileSync(join(folder, file), 'utf8')));
  }
  if (folder === fromRoot('templates', 'mail')) cache = map;
  return map;
}

export type MailData = Record<string, string | number>;

export function renderMail(template: MailTemplate, data: MailData): { subject: string; body: string } {
  const missing = template.placeholders.filter((p) => data[p] === undefined);
  if (missing.length > 0) {
    throw new Error(`mail template "${template.name}": missing data for ${missing.map((m) => `{{${m}}}`).join(', ')}`);
  }
  const fill = (s: string) => s.replace(placeholderPattern, (_all, key: string) => String(data[key]));
  return { subject: fill(template.subject).replace(/[\r\n]+/g, ' '), body: fill(template.body) };
}
