import { existsSync, readFileSync } from 'node:fs';
import { z } from 'zod';
import { fromRoot } from '../../platform/app-root';
import type { Env } from '../../platform/env';
import { html, raw, type Raw } from './html';

// The readers' pages load their own small client (decision 080), not the staff app: one style
// sheet (src/reader/reader.css), the play script (src/reader/main.tsx) on puzzle pages, and the
// height script (src/reader/embed-height.ts) on embed pages. In production the built files'
// names come from Vite's manifest (dist/client/.vite/manifest.json, backend integration);
// otherwise the sources are named and Vite's middleware serves them (npm run dev).

export const readerEntries = {
  css: 'src/reader/reader.css',
  play: 'src/reader/main.tsx',
  embed: 'src/reader/embed-height.ts',
} as const;
export type ReaderEntry = keyof typeof readerEntries;

const manifestSchema = z.record(z.string(), z.object({ file: z.string(), css: z.array(z.string()).optional(), imports: z.array(z.string()).optional() }));
type Manifest = z.infer<typeof manifestSchema>;

export type ReaderAssets = {
  /** <link> and <script> tags for the head: the style sheet and the given scripts (with their preloads) */
  tags(scripts: readonly Exclude<ReaderEntry, 'css'>[]): Raw;
};

function builtAssets(manifest: Manifest): ReaderAssets {
  const entry = (src: string) => {
    const e = manifest[src];
    if (!e) throw new Error(`the client build has no entry ${src} (run npm run build)`);
    return e;
  };
  const css = entry(readerEntries.css).file;
  return {
    tags(scripts) {
      const preload = new Set<string>();
      const seen = new Set<string>();
      const walk = (key: string) => {
        for (const imp of manifest[key]?.imports ?? []) {
          if (seen.has(imp)) continue;
          seen.add(imp);
          preload.add(entry(imp).file);
          walk(imp);
        }
      };
      for (const s of scripts) walk(readerEntries[s]);
      return html`<link rel="stylesheet" href="/${css}">${[...preload].map((f) => html`<link rel="modulepreload" href="/${f}">`)}${scripts.map(
        (s) => html`<script type="module" src="/${entry(readerEntries[s]).file}"></script>`,
      )}`;
    },
  };
}

const devAssets: ReaderAssets = {
  tags(scripts) {
    return html`<link rel="stylesheet" href="/${readerEntries.css}">${scripts.length > 0 ? raw('<script type="module" src="/@vite/client"></script>') : ''}${scripts.map(
      (s) => html`<script type="module" src="/${readerEntries[s]}"></script>`,
    )}`;
  },
};

/** The built client's reader files in production; the sources (served by Vite) otherwise. */
export function readerAssets(env: Pick<Env, 'NODE_ENV'>): ReaderAssets {
  const file = fromRoot('dist', 'client', '.vite', 'manifest.json');
  if (env.NODE_ENV !== 'production' || !existsSync(file)) return devAssets;
  return builtAssets(manifestSchema.parse(JSON.parse(readFileSync(file, 'utf8'))));
}
