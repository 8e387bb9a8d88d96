// The tiling commands of the command line: verify, network, solve.
//   verify [FILE]   one code per line (stdin without FILE); blank and '#' lines skipped;
//                   one JSON object per code line; exit 0 all valid, 1 any invalid, 2 usage
//   network CODE    the Smith diagrams of one tiling and Kirchhoff's laws checked, as JSON
//   solve FILE.json a plane network with poles -> the squared rectangle, as JSON

import { createReadStream, readFileSync, statSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { z } from 'zod';
import {
  acceptCode,
  TilingInputError,
  canonicalCode,
  checkKirchhoff,
  classifyTiling,
  parseTiling,
  planeGraphFromDrawing,
  smithDiagram,
  solvePlaneNetwork,
  tilingSpanningTrees,
  toBouwkamp,
  type PlaneGraph,
} from '../../shared/tiling/index';

/** A usage error: exit code 2. */
export class CliUsageError extends Error {}

type Write = (s: string) => void;

function errorText(e: unknown): string {
  if (e instanceof TilingInputError) return e.message;
  return `internal error: ${e instanceof Error ? e.message : String(e)}`;
}

/** The verdict for one code line, exactly the documented JSON object. */
export function verifyLine(code: string, line: number): { ok: boolean; json: string } {
  try {
    // one decode for verification, classification and the canonical code (acceptCode)
    const f = acceptCode(code);
    const c = f.classification;
    const out = {
      line,
      ok: true,
      order: c.order,
      width: c.width,
      height: c.height,
      square: c.square,
      perfect: c.perfect,
      simple: c.simple,
      canonical: f.code,
      spanningTrees: tilingSpanningTrees(f.tiling).toString(),
    };
    return { ok: true, json: JSON.stringify(out) };
  } catch (e) {
    return { ok: false, json: JSON.stringify({ line, ok: false, error: errorText(e) }) };
  }
}

export async function runVerify(argv: readonly string[], write: Write): Promise<number> {
  if (argv.length > 1) throw new CliUsageError('usage: verify [FILE]  (reads standard input without FILE)');
  const file = argv[0];
  let stream: NodeJS.ReadableStream;
  if (file === undefined || file === '-') {
    stream = process.stdin;
  } else {
    try {
      if (!statSync(file).isFile()) throw Object.assign(new Error('not a file'), { code: 'not a file' });
    } catch (e) {
      throw new CliUsageError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? 'error'}`);
    }
    stream = createReadStream(file, { encoding: 'utf8' });
  }
  const rl = createInterface({ input: stream, crlfDelay: Infinity });
  let n = 0;
  let allOk = true;
  for await (const raw of rl) {
    n++;
    const text = raw.trim();
    if (text === '' || text.startsWith('#')) continue;
    const r = verifyLine(text, n);
    if (!r.ok) allOk = false;
    write(r.json);
  }
  return allOk ? 0 : 1;
}

const big = (v: bigint) => v.toString();

export function runNetwork(argv: readonly string[], write: Write): number {
  if (argv.length === 0) throw new CliUsageError('usage: network CODE  (a Bouwkamp or table code; quote it)');
  const code = argv.join(' ');
  try {
    const t = parseTiling(code);
    const horizontal = smithDiagram(t, 'horizontal');
    const vertical = smithDiagram(t, 'vertical');
    const k = checkKirchhoff(t);
    write(
      JSON.stringify({
        ok: true,
        canonical: canonicalCode(t),
        width: t.W,
        height: t.H,
        spanningTrees: big(tilingSpanningTrees(t)),
        kirchhoff: k,
        horizontal,
        vertical,
      }),
    );
    return k.ok ? 0 : 1;
  } catch (e) {
    write(JSON.stringify({ ok: false, error: errorText(e) }));
    return 1;
  }
}

const pole = z.object({ p: z.number().int().min(0), q: z.number().int().min(0) }, { error: 'poles must be { "p": vertex, "q": vertex }' });
const rotationInput = z.object({
  n: z.number().int().min(2),
  adj: z.array(z.array(z.number().int().min(0))),
  poles: pole,
});
const drawingInput = z.object({
  nodes: z.array(z.object({ x: z.number(), y: z.number() })).min(2),
  edges: z.array(z.tuple([z.number().int().min(0), z.number().int().min(0)])),
  poles: pole,
});
export const solveInput = z.union([rotationInput, drawingInput], {
  error: 'expected { "n", "adj", "poles": { "p", "q" } } (rotation system) or { "nodes": [{ "x", "y" }], "edges": [[a, b]], "poles": { "p", "q" } } (drawing)',
});

export function solveJson(text: string): { ok: boolean; json: string } {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    return { ok: false, json: JSON.stringify({ ok: false, code: 'bad-json', error: `not valid JSON: ${(e as Error).message}` }) };
  }
  const parsed = solveInput.safeParse(data);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue && issue.path.length > 0 ? ` at ${issue.path.join('.')}` : '';
    return { ok: false, json: JSON.stringify({ ok: false, code: 'bad-input', error: `${issue?.message ?? 'invalid input'}${where}` }) };
  }
  const input = parsed.data;
  let g: PlaneGraph;
  if ('adj' in input) {
    g = { n: input.n, adj: input.adj };
  } else {
    const r = planeGraphFromDrawing(input.nodes, input.edges as [number, number][]);
    if (r instanceof TilingInputError) return { ok: false, json: JSON.stringify({ ok: false, code: r.code, error: r.message }) };
    g = r;
  }
  const r = solvePlaneNetwork(g, input.poles);
  if (!r.ok) return { ok: false, json: JSON.stringify({ ok: false, code: r.code, error: r.message }) };
  const c = classifyTiling(r.tiling);
  return {
    ok: true,
    json: JSON.stringify({
      ok: true,
      code: toBouwkamp(r.tiling, { header: true }),
      canonical: canonicalCode(r.tiling),
      fullWidth: big(r.fullWidth),
      fullHeight: big(r.fullHeight),
      spanningTrees: big(r.spanningTrees),
      gcd: big(r.gcd),
      order: c.order,
      width: c.width,
      height: c.height,
      square: c.square,
      perfect: c.perfect,
      simple: c.simple,
      tiling: r.tiling,
    }),
  };
}

export function runSolve(argv: readonly string[], write: Write): number {
  if (argv.length !== 1) throw new CliUsageError('usage: solve FILE.json  (a plane network with poles)');
  let text: string;
  try {
    text = readFileSync(argv[0]!, 'utf8');
  } catch (e) {
    throw new CliUsageError(`cannot read ${argv[0]}: ${(e as NodeJS.ErrnoException).code ?? 'error'}`);
  }
  if (text.length > 1_000_000) {
    write(JSON.stringify({ ok: false, code: 'too-long', error: `the file has ${text.length} characters; at most 1000000 are accepted` }));
    return 1;
  }
  const r = solveJson(text);
  write(r.json);
  return r.ok ? 0 : 1;
}
