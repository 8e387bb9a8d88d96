import { useRef, type KeyboardEvent } from 'react';
import type { DeductionPlay } from '../../shared/contracts/reader';
import type { Entry } from './progress';

// The Deduction board: the not-to-scale drawing with the givens printed. Each square is a
// focusable cell: type its size (digits; Backspace takes one back, Delete clears), move with
// the arrow keys (to the nearest square that way) or Tab. A tap (or click) on a square
// selects it and puts the caret in the size box below, which brings up a phone's number pad.

export type DeductionBoardProps = {
  play: DeductionPlay;
  entries: Entry[];
  wrong: ReadonlySet<number>;
  locked: boolean;
  selected: number | null;
  onSelect: (square: number | null) => void;
  onEnter: (square: number, size: number | null) => void;
};

const MAX_DIGITS = 9;

export function DeductionBoard({ play, entries, wrong, locked, selected, onSelect, onEnter }: DeductionBoardProps) {
  const { W, H, rects } = play.drawing;
  const givens = new Map(play.givens.map((g) => [g.square, g.size]));
  const typed = new Map(entries.map((e) => [e.square, e.size]));
  const cells = useRef<(SVGGElement | null)[]>([]);
  const input = useRef<HTMLInputElement>(null);

  const focusCell = (i: number) => {
    onSelect(i);
    cells.current[i]?.focus();
  };

  /** The nearest square whose centre lies that way from square i. */
  const neighbour = (i: number, dx: number, dy: number): number | null => {
    const a = rects[i]!;
    const ca = { x: a.x + a.w / 2, y: a.y + a.h / 2 };
    let best: number | null = null;
    let bestD = Infinity;
    rects.forEach((b, j) => {
      if (j === i) return;
      const vx = b.x + b.w / 2 - ca.x;
      const vy = b.y + b.h / 2 - ca.y;
      const along = vx * dx + vy * dy;
      if (along <= 0) return;
      const across = Math.abs(vx * dy - vy * dx);
      const d = along + 2 * across;
      if (d < bestD) [best, bestD] = [j, d];
    });
    return best;
  };

  const onCellKeyDown = (e: KeyboardEvent, i: number) => {
    const moves: Record<string, [number, number]> = { ArrowRight: [1, 0], ArrowLeft: [-1, 0], ArrowDown: [0, 1], ArrowUp: [0, -1] };
    const m = moves[e.key];
    if (m) {
      e.preventDefault();
      const j = neighbour(i, m[0], m[1]);
      if (j !== null) focusCell(j);
      return;
    }
    if (locked || givens.has(i)) return;
    const now = typed.get(i);
    if (/^\d$/.test(e.key)) {
      e.preventDefault();
      const text = `${now ?? ''}${e.key}`.replace(/^0+/, '').slice(0, MAX_DIGITS);
      onEnter(i, text === '' ? null : Number(text));
    } else if (e.key === 'Backspace') {
      e.preventDefault();
      const text = String(now ?? '').slice(0, -1);
      onEnter(i, text === '' ? null : Number(text));
    } else if (e.key === 'Delete') {
      e.preventDefault();
      onEnter(i, null);
    } else if (e.key === 'Enter') {
      e.preventDefault();
      input.current?.focus();
    }
  };

  const minSide = (r: { w: number; h: number }) => Math.min(r.w, r.h);
  const sel = selected !== null && rects[selected] ? selected : null;

  return (
    <div className="space-y-3">
      <svg viewBox={`-0.5 -0.5 ${W + 1} ${H + 1}`} className="block h-auto w-full select-none rounded border border-rule bg-surface" role="group" aria-label={`Drawing, not to scale: ${rects.length} squares, ${play.givens.length} sizes given`} data-testid="deduction-board">
        {rects.map((r, i) => {
          const given = givens.get(i);
          const value = given ?? typed.get(i);
          const isWrong = wrong.has(i);
          const label = play.labels[i] ?? String(i + 1);
          const shown = `${value ?? ''}${isWrong ? ' \u2715' : ''}`;
          return (
            <g
              key={i}
              ref={(el) => {
                cells.current[i] = el;
              }}
              role="button"
              tabIndex={0}
              data-square={i}
              aria-label={`${label}${value !== undefined ? ` ${shown}` : ''}: square ${label}, ${given !== undefined ? 'given' : value !== undefined ? (isWrong ? 'wrong' : 'entered') : 'empty'}`}
              className="cursor-pointer focus:outline-none"
              onFocus={() => onSelect(i)}
              onClick={() => focusCell(i)}
              onKeyDown={(e) => onCellKeyDown(e, i)}
            >
              <rect x={r.x} y={r.y} width={r.w} height={r.h} fill={isWrong ? '#f6e1de' : sel === i ? '#e9c9b6' : given !== undefined ? '#efeae0' : '#fffdf9'} stroke={isWrong ? '#a23a32' : '#1f2328'} strokeWidth={isWrong ? 3 : sel === i ? 2.5 : 1} vectorEffect="non-scaling-stroke" />
              {/* one text element, so what is seen reads as the start of the square's name: "E 6" */}
              <text>
                <tspan x={r.x + minSide(r) * 0.08} y={r.y + minSide(r) * 0.08} fontSize={Math.min(minSide(r) * 0.22, Math.max(W, H) / 22)} dominantBaseline="hanging" fill="#5c6169">
                  {label}
                </tspan>
                {value !== undefined ? (
                  <tspan x={r.x + r.w / 2} y={r.y + r.h / 2} fontSize={minSide(r) * 0.36} textAnchor="middle" dominantBaseline="central" fill={isWrong ? '#a23a32' : '#1f2328'} fontWeight={given !== undefined ? 700 : 400}>
                    {` ${shown}`}
                  </tspan>
                ) : null}
              </text>
            </g>
          );
        })}
      </svg>
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <label htmlFor="deduction-size" className="font-semibold">
          {sel === null ? 'Choose a square' : `Size of square ${play.labels[sel] ?? sel + 1}`}
        </label>
        <input
          ref={input}
          id="deduction-size"
          inputMode="numeric"
          pattern="[0-9]*"
          autoComplete="off"
          disabled={locked || sel === null || givens.has(sel)}
          value={sel === null ? '' : String(givens.get(sel) ?? typed.get(sel) ?? '')}
          onChange={(e) => {
            if (sel === null) return;
            const digits = e.target.value.replace(/\D/g, '').replace(/^0+/, '').slice(0, MAX_DIGITS);
            onEnter(sel, digits === '' ? null : Number(digits));
          }}
          onKeyDown={(e) => {
            if (e.key === 'Enter' && sel !== null) {
              e.preventDefault();
              focusCell(sel);
            }
          }}
          className="w-28 rounded border border-rule-strong bg-surface px-2 py-1 tabular disabled:opacity-50"
        />
        <span className="text-ink-muted">Type on a square, or here; arrow keys move between squares.</span>
      </p>
    </div>
  );
}
