import type { KeyboardEvent } from 'react';
import { notToScaleLayout, squareLabel } from '../../../../shared/puzzle/index';
import { TilingDrawing, type TilingDrawingTiling } from '../../../components/tiling-drawing';
import { fillForSize, tilingPalette } from '../../../components/tiling-palette';

const key = (x: number, y: number) => `${x},${y}`;

/**
 * The tiling drawn to scale, each square a toggle (click, or Enter / Space): the chosen
 * squares (givens or starter pieces) are highlighted.
 */
export function ChooseSquares({ tiling, chosen, onToggle, what, disabled = false }: { tiling: TilingDrawingTiling; chosen: ReadonlySet<string>; onToggle: (x: number, y: number) => void; what: string; disabled?: boolean }) {
  const { W, H, squares } = tiling;
  // same box as TilingDrawing, so the toggles sit exactly on the squares
  const stroke = Math.max(W, H) / 400;
  const highlight = squares.flatMap((q, i) => (chosen.has(key(q.x, q.y)) ? [i] : []));
  const onKey = (e: KeyboardEvent, x: number, y: number) => {
    if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); onToggle(x, y); }
  };
  return (
    <div className="relative">
      <TilingDrawing tiling={tiling} highlight={highlight} title={`The tiling: choose the ${what}`} pixelWidth={undefined} />
      <svg
        viewBox={`${-stroke} ${-stroke} ${W + 2 * stroke} ${H + 2 * stroke}`}
        className="absolute inset-0 h-full w-full"
        role="group"
        aria-label={`Squares: press one to add it to or take it out of the ${what}`}
      >
        {squares.map((q, i) => {
          const on = chosen.has(key(q.x, q.y));
          return (
            <rect
              key={i}
              x={q.x}
              y={q.y}
              width={q.s}
              height={q.s}
              fill="transparent"
              pointerEvents="all"
              role="checkbox"
              aria-checked={on}
              aria-disabled={disabled || undefined}
              aria-label={`Square ${squareLabel(i)}, size ${q.s}, at ${q.x}, ${q.y}`}
              tabIndex={disabled ? -1 : 0}
              data-square={i}
              className={disabled ? 'cursor-not-allowed' : 'cursor-pointer focus:outline-none focus-visible:stroke-[color:var(--color-accent,#c8642b)]'}
              strokeWidth={stroke * 3}
              onClick={() => { if (!disabled) onToggle(q.x, q.y); }}
              onKeyDown={(e) => { if (!disabled) onKey(e, q.x, q.y); }}
            />
          );
        })}
      </svg>
    </div>
  );
}

/**
 * A Deduction puzzle as it prints: the not-to-scale layout (every adjacency kept, sizes
 * hidden), the givens written in their cells, the other cells lettered.
 */
export function DeductionPreview({ tiling, givens, showFrame, width = 360 }: { tiling: TilingDrawingTiling; givens: readonly { x: number; y: number; size: number }[]; showFrame: boolean; width?: number }) {
  const layout = notToScaleLayout(tiling);
  const given = new Map(givens.map((g) => [key(g.x, g.y), g.size]));
  const stroke = Math.max(layout.width, layout.height) / 300;
  const label = `Deduction puzzle, not to scale: ${tiling.squares.length} squares, ${givens.length} sizes given`;
  return (
    <figure className="flex flex-col gap-1">
      <svg role="img" aria-label={label} viewBox={`${-stroke} ${-stroke} ${layout.width + 2 * stroke} ${layout.height + 2 * stroke}`} style={{ width: `${width}px`, maxWidth: '100%', height: 'auto' }}>
        <title>{label}</title>
        <rect x={0} y={0} width={layout.width} height={layout.height} fill={tilingPalette.paper} />
        {layout.rects.map((r, i) => {
          const q = tiling.squares[i]!;
          const size = given.get(key(q.x, q.y));
          const fs = Math.min(r.w, r.h) * 0.42;
          return (
            <g key={i} data-cell={i} data-given={size !== undefined ? size : undefined}>
              <rect x={r.x} y={r.y} width={r.w} height={r.h} fill={size !== undefined ? tilingPalette.accentFill : '#ffffff'} stroke={tilingPalette.ink} strokeWidth={stroke} />
              <text x={r.x + r.w / 2} y={r.y + r.h / 2} fontSize={size !== undefined ? fs : fs * 0.6} textAnchor="middle" dominantBaseline="central" fill={size !== undefined ? tilingPalette.ink : tilingPalette.muted}>
                {size !== undefined ? size : squareLabel(i)}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className="text-xs text-ink-muted">
        Not to scale.{showFrame ? ` The frame is ${tiling.W} by ${tiling.H}.` : ''} Lettered cells are for the solver to find.
      </figcaption>
    </figure>
  );
}

/** Pieces laid out in rows at the frame's scale, at most the frame's width wide. */
function layPieces(pieces: readonly { x: number; y: number; s: number }[], W: number) {
  const gap = Math.max(1, W / 60);
  let x = 0;
  let y = 0;
  let rowH = 0;
  const laid = pieces.map((q) => {
    if (x > 0 && x + q.s > W) { x = 0; y += rowH + gap; rowH = 0; }
    const at = { q, x, y };
    x += q.s + gap;
    rowH = Math.max(rowH, q.s);
    return at;
  });
  return { laid, height: y + rowH };
}

/** An Assembly puzzle as it prints: the empty frame with any starter pieces in place, and the pieces beside it. */
export function AssemblyPreview({ tiling, starters, width = 360 }: { tiling: TilingDrawingTiling; starters: readonly { x: number; y: number; size: number }[]; width?: number }) {
  const { W, H } = tiling;
  const stroke = Math.max(W, H) / 300;
  const pieces = [...tiling.squares].sort((a, b) => b.s - a.s);
  const started = new Set(starters.map((s) => key(s.x, s.y)));
  const loose = pieces.filter((q) => !started.has(key(q.x, q.y)));
  const { laid, height: piecesH } = layPieces(loose, W);
  const frameLabel = `Assembly frame ${W} by ${H}${starters.length ? ` with ${starters.length} starter piece(s) in place` : ''}`;
  const piecesLabel = `${loose.length} pieces to place`;
  return (
    <div className="flex flex-col gap-3">
      <svg role="img" aria-label={frameLabel} viewBox={`${-stroke} ${-stroke} ${W + 2 * stroke} ${H + 2 * stroke}`} style={{ width: `${width}px`, maxWidth: '100%', height: 'auto' }}>
        <title>{frameLabel}</title>
        <rect x={0} y={0} width={W} height={H} fill="#ffffff" stroke={tilingPalette.ink} strokeWidth={stroke * 2} />
        {starters.map((s, i) => (
          <g key={i} data-starter={s.size}>
            <rect x={s.x} y={s.y} width={s.size} height={s.size} fill={fillForSize(s.size)} stroke={tilingPalette.ink} strokeWidth={stroke} />
            <text x={s.x + s.size / 2} y={s.y + s.size / 2} fontSize={s.size * 0.4} textAnchor="middle" dominantBaseline="central" fill={tilingPalette.ink}>{s.size}</text>
          </g>
        ))}
      </svg>
      {loose.length > 0 ? (
        <svg role="img" aria-label={piecesLabel} viewBox={`0 0 ${W} ${Math.max(1, piecesH)}`} style={{ width: `${width}px`, maxWidth: '100%', height: 'auto' }}>
          <title>{piecesLabel}</title>
          {laid.map(({ q, x: px, y: py }, i) => (
            <g key={i} data-piece={q.s}>
              <rect x={px} y={py} width={q.s} height={q.s} fill={fillForSize(q.s)} stroke={tilingPalette.ink} strokeWidth={stroke} />
              <text x={px + q.s / 2} y={py + q.s / 2} fontSize={Math.min(q.s * 0.45, (q.s * 0.85) / Math.max(1, String(q.s).length * 0.62))} textAnchor="middle" dominantBaseline="central" fill={tilingPalette.ink}>{q.s}</text>
            </g>
          ))}
        </svg>
      ) : null}
    </div>
  );
}
