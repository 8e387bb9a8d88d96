import type { Verdict } from '../../../../shared/contracts/tilings';
import { Alert } from '../../../components/alert';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { TilingCode, TilingFacts } from '../../../components/tiling-facts';

/** Where an engine error is, in words: "line 1, column 25, group 3, element 6". */
export function whereText(where: Record<string, unknown> | undefined, options: { withLine?: boolean } = {}): string {
  if (!where) return '';
  const parts: string[] = [];
  // an upload checks each line on its own: the engine's "line 1" is the file's line, shown beside it
  for (const k of options.withLine === false ? (['column', 'group', 'element', 'square'] as const) : (['line', 'column', 'group', 'element', 'square'] as const)) {
    const v = where[k];
    if (typeof v === 'number') parts.push(`${k} ${v}`);
  }
  const edges = where.edges;
  if (Array.isArray(edges) && edges.length === 2) parts.push(`edges ${Number(edges[0]) + 1} and ${Number(edges[1]) + 1}`);
  return parts.join(', ');
}

/** The verdict of the tiling check: the drawing and class, or the precise error. */
export function VerdictView({ verdict }: { verdict: Verdict }) {
  if (!verdict.valid) {
    const at = whereText(verdict.error.where);
    return (
      <Alert tone="danger" title="This code does not make a tiling">
        <p>{verdict.error.message}</p>
        {at ? <p className="mt-1 font-mono text-xs">at {at}</p> : null}
      </Alert>
    );
  }
  return (
    <div className="flex flex-col gap-3">
      <Alert tone={verdict.duplicate ? 'warning' : 'success'} title={verdict.duplicate ? 'Valid, but a duplicate' : 'Valid tiling'}>
        {verdict.duplicate
          ? verdict.duplicateOf === 'stock'
            ? 'The same tiling (up to turning and mirroring) is already in the stock. You can still send it; the editor will see the flag.'
            : 'The same tiling (up to turning and mirroring) is already waiting for review. You can still send it; the editor will see the flag.'
          : 'Checked exactly: every square fits and Kirchhoff’s laws hold.'}
      </Alert>
      <div className="max-w-md rounded-md border border-rule bg-surface p-2">
        <TilingDrawing tiling={verdict.tiling} />
      </div>
      <TilingFacts facts={verdict} />
      <TilingCode label="Canonical code" code={verdict.canonicalCode} />
    </div>
  );
}
