import type { TilingFactsData } from '../../shared/contracts/tilings';
import { StatusBadge } from './status-badge';

/** The class of a tiling in words and badges (text, never colour alone). */
export function TilingFacts({ facts }: { facts: TilingFactsData }) {
  const { order, width, height, square, perfect, simple } = facts;
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm text-ink">
        <span className="font-semibold tabular-nums">{width} × {height}</span>
        {square ? ' squared square' : ' squared rectangle'} of order <span className="font-semibold tabular-nums">{order}</span>
      </p>
      <ul aria-label="Classification" className="flex flex-wrap gap-1.5">
        <li><StatusBadge tone={perfect ? 'success' : 'neutral'}>{perfect ? 'Perfect' : 'Imperfect'}</StatusBadge></li>
        <li><StatusBadge tone={simple ? 'success' : 'neutral'}>{simple ? 'Simple' : 'Compound'}</StatusBadge></li>
        {square ? <li><StatusBadge tone="info">Square</StatusBadge></li> : null}
      </ul>
    </div>
  );
}

/** A tiling code in monospace with a label, selectable for copying. */
export function TilingCode({ label, code }: { label: string; code: string }) {
  return (
    <div className="flex flex-col gap-0.5">
      <span className="text-xs font-semibold uppercase tracking-wide text-ink-muted">{label}</span>
      <code className="break-all rounded border border-rule bg-paper px-2 py-1 font-mono text-sm text-ink">{code}</code>
    </div>
  );
}
