import { z } from 'zod';
import { MAX_TITLE, MAX_UPLOAD_LINES } from '../../../shared/contracts/submissions';
import type { TilingError } from '../../../shared/contracts/tilings';
import { tilingSchema } from '../../../shared/contracts/tilings';
import { defineJob } from '../../platform/jobs/types';
import { analyseCode } from '../stock/index';

// An uploaded file of codes is checked on a job worker (kind 'intake-upload'): every line is
// decoded and verified exactly (about 12 ms for a 2,000-square code), duplicates within the
// file are found here; each line's verdict goes back to the server, whose sink (./uploads.ts)
// stores the submissions in small batches. No database here.

export const UPLOAD_KIND = 'intake-upload';

/** The numbered code lines of a file: blank lines and `#` comments skipped. */
export function uploadCodeLines(text: string): { line: number; code: string }[] {
  const out: { line: number; code: string }[] = [];
  const lines = text.split(/\r\n|\r|\n/);
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  lines.forEach((raw, i) => {
    const code = raw.trim();
    if (code === '' || code.startsWith('#')) return;
    out.push({ line: i + 1, code });
  });
  return out;
}

export function captionOf(code: string): string | null {
  const i = code.indexOf('*');
  if (i < 0) return null;
  const t = code.slice(i + 1).trim().slice(0, MAX_TITLE);
  return t || null;
}

export const uploadParamsSchema = z.object({
  fileName: z.string().min(1).max(255),
  /** where the server keeps the file until the job ends (relative to DATA_DIR; read by the server only) */
  file: z.string().min(1),
});
export type UploadParams = z.infer<typeof uploadParamsSchema>;

const inputSchema = z.object({ text: z.string() });

const sizeSchema = { order: z.number().int(), width: z.number().int(), height: z.number().int() };

/** One line's verdict, as the worker sends it to the server. */
export const checkedLineSchema = z.discriminatedUnion('verdict', [
  z.object({ line: z.number().int(), verdict: z.literal('invalid'), error: z.object({ code: z.string(), message: z.string(), where: z.record(z.string(), z.unknown()).optional() }) }),
  z.object({ line: z.number().int(), verdict: z.literal('this-file'), ...sizeSchema }),
  z.object({
    line: z.number().int(),
    verdict: z.literal('ok'),
    code: z.string(),
    title: z.string().nullable(),
    canonicalCode: z.string(),
    canonicalKey: z.string(),
    reducedKey: z.string(),
    gcd: z.number().int(),
    tiling: tilingSchema,
    square: z.boolean(),
    perfect: z.boolean(),
    simple: z.boolean(),
    ...sizeSchema,
  }),
]);
export type CheckedLine = z.infer<typeof checkedLineSchema>;

export const handler = defineJob({
  kind: UPLOAD_KIND,
  parseParams: (raw) => uploadParamsSchema.parse(raw),
  run(ctx) {
    const { text } = inputSchema.parse(ctx.input);
    const entries = uploadCodeLines(text);
    if (entries.length > MAX_UPLOAD_LINES) throw new Error(`the file has more than ${MAX_UPLOAD_LINES} code lines`);
    const seen = new Set<string>();
    let done = 0;
    for (const e of entries) {
      if (ctx.shouldStop()) break;
      const r = analyseCode(e.code);
      let item: CheckedLine;
      if (!r.ok) {
        const error: TilingError = r.error;
        item = { line: e.line, verdict: 'invalid', error };
      } else {
        const a = r.analysis;
        const c = a.classification;
        const size = { order: c.order, width: a.tiling.W, height: a.tiling.H };
        // the same tiling at any scale earlier in this file
        if (seen.has(a.reducedKey)) item = { line: e.line, verdict: 'this-file', ...size };
        else {
          seen.add(a.reducedKey);
          item = {
            line: e.line, verdict: 'ok', code: e.code, title: captionOf(e.code),
            canonicalCode: a.canonicalCode, canonicalKey: a.canonicalKey, reducedKey: a.reducedKey, gcd: a.gcd,
            tiling: a.tiling, square: c.square, perfect: c.perfect, simple: c.simple, ...size,
          };
        }
      }
      ctx.emit(item);
      done++;
      ctx.progress({ phase: 'lines checked', done, total: entries.length, found: done });
    }
    return { lines: entries.length, checked: done };
  },
});
