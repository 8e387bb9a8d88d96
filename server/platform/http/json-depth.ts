import type { RequestHandler } from 'express';
import type { ErrorBody } from '../../../shared/contracts/common';

// JSON nesting limit. No request of this API nests deeper than a rich text document inside
// an edition patch (body.slots.N.instructions and its content, at most 16 node levels, see
// shared/rich-text); validators recurse, so a body nested thousands of levels deep would
// overflow their stack. Checked without recursion, right after the body is parsed: 422 with
// the path where the limit is passed.

export const MAX_JSON_DEPTH = 48;

/** The first place where `value` nests deeper than `max`, or null. Iterative (no stack to overflow). */
export function jsonDepthProblem(value: unknown, root: string, max = MAX_JSON_DEPTH): { path: string; message: string } | null {
  type Entry = { v: unknown; depth: number; key: string; parent: Entry | null };
  const stack: Entry[] = [{ v: value, depth: 0, key: root, parent: null }];
  for (let e = stack.pop(); e !== undefined; e = stack.pop()) {
    const v = e.v;
    if (v === null || typeof v !== 'object') continue;
    if (e.depth >= max) {
      const path: string[] = [];
      for (let p: Entry | null = e; p !== null; p = p.parent) path.unshift(p.key.length > 40 ? `${p.key.slice(0, 37)}...` : p.key);
      const shown = path.length > 14 ? [...path.slice(0, 8), '...', ...path.slice(-4)] : path;
      return { path: shown.join('.'), message: `nested more than ${max} levels deep` };
    }
    const children: [string, unknown][] = Array.isArray(v) ? v.map((x, i) => [String(i), x]) : Object.entries(v);
    for (const [key, x] of children) if (x !== null && typeof x === 'object') stack.push({ v: x, depth: e.depth + 1, key, parent: e });
  }
  return null;
}

/** After express.json(): a parsed body nested too deeply is a 422. */
export function jsonDepthGuard(max = MAX_JSON_DEPTH): RequestHandler {
  return (req, res, next) => {
    const problem = req.body !== undefined && req.body !== null && typeof req.body === 'object' && !Buffer.isBuffer(req.body) ? jsonDepthProblem(req.body, 'body', max) : null;
    if (!problem) {
      next();
      return;
    }
    const body: ErrorBody = { error: { code: 'unprocessable', message: `The request body is nested more than ${max} levels deep (at ${problem.path}).`, details: [problem] } };
    res.status(422).json(body);
  };
}
