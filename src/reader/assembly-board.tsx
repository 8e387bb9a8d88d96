import { useMemo, useRef, useState, type KeyboardEvent, type PointerEvent as ReactPointerEvent } from 'react';
import type { AssemblyPlay } from '../../shared/contracts/reader';
import { firstFreePlace, fits, overlaps, snap, step, stopsFor, type Square } from './assembly-geometry';
import type { Placement } from './progress';

// The Assembly board: the frame with the starter pieces fixed in it, the pieces still to
// place in a tray below. A piece is placed, moved or removed
//  - by pointer or touch: drag it from the tray (or from the board) and drop it; it snaps to
//    the nearest place against an edge; dropped outside the frame it goes back to the tray;
//    a tap on a piece picks it up and a tap on the frame puts it down;
//  - by keyboard alone: Enter on a piece in the tray (or on the board) picks it up, the arrow
//    keys move it from edge to edge, Enter puts it down, Escape puts it back, Delete removes it.

type Held = { piece: number; x: number; y: number; from: 'tray' | 'board'; dragging: boolean; offset: { x: number; y: number } };

export type AssemblyBoardProps = {
  play: AssemblyPlay;
  placements: Placement[];
  wrong: ReadonlySet<number>;
  locked: boolean;
  selected: number | null;
  onSelect: (piece: number | null) => void;
  onPlace: (p: Placement) => void;
  onRemove: (piece: number) => void;
  onMessage: (text: string) => void;
};

const INK = '#1f2328';

export function AssemblyBoard({ play, placements, wrong, locked, selected, onSelect, onPlace, onRemove, onMessage }: AssemblyBoardProps) {
  const { W, H } = play.frame;
  const svg = useRef<SVGSVGElement>(null);
  const [heldState, setHeld] = useState<Held | null>(null);
  // a finished or paused board holds nothing
  const held = locked ? null : heldState;
  const pointerStart = useRef<{ x: number; y: number; piece: number; from: 'tray' | 'board' } | null>(null);

  const starters = useMemo(() => new Map(play.starters.map((s) => [s.piece, s])), [play.starters]);
  const placedBy = new Map(placements.map((p) => [p.piece, p]));
  const onBoard: (Square & { piece: number; starter: boolean })[] = [
    ...play.starters.map((s) => ({ piece: s.piece, x: s.x, y: s.y, s: play.pieces[s.piece]!, starter: true })),
    ...placements.map((p) => ({ piece: p.piece, x: p.x, y: p.y, s: play.pieces[p.piece]!, starter: false })),
  ];
  const tray = play.pieces.map((s, piece) => ({ piece, s })).filter((p) => !starters.has(p.piece) && !placedBy.has(p.piece));
  const others = (piece: number) => onBoard.filter((q) => q.piece !== piece);
  const largest = Math.max(...play.pieces);

  const blockerOf = (q: Square, piece: number) => others(piece).find((o) => overlaps(q, o));
  const validAt = (piece: number, x: number, y: number) => {
    const q = { x, y, s: play.pieces[piece]! };
    return fits(play.frame, q) && !blockerOf(q, piece);
  };

  const pickUp = (piece: number, from: 'tray' | 'board') => {
    if (locked) return;
    const s = play.pieces[piece]!;
    const at = from === 'board' ? placedBy.get(piece)! : firstFreePlace(play.frame, s, others(piece));
    setHeld({ piece, x: at.x, y: at.y, from, dragging: false, offset: { x: s / 2, y: s / 2 } });
    onSelect(piece);
    onMessage(`Piece ${s} picked up: arrow keys move it, Enter puts it down, Escape puts it back.`);
    svg.current?.focus();
  };

  const putDown = (h: Held) => {
    const s = play.pieces[h.piece]!;
    const q = { x: h.x, y: h.y, s };
    if (!fits(play.frame, q)) {
      onMessage(`Piece ${s} does not fit there.`);
      return false;
    }
    const blocker = blockerOf(q, h.piece);
    if (blocker) {
      onMessage(`Piece ${s} would overlap piece ${blocker.s}.`);
      return false;
    }
    onPlace({ piece: h.piece, x: h.x, y: h.y });
    setHeld(null);
    onMessage(`Piece ${s} placed at ${h.x}, ${h.y}.`);
    return true;
  };

  const toUnits = (clientX: number, clientY: number) => {
    const r = svg.current?.getBoundingClientRect();
    if (!r || r.width === 0) return null;
    // the view box has a margin of one unit around the frame
    const x = ((clientX - r.left) / r.width) * (W + 2) - 1;
    const y = ((clientY - r.top) / r.height) * (H + 2) - 1;
    return { x, y, inside: clientX >= r.left && clientX <= r.right && clientY >= r.top && clientY <= r.bottom, unitsPerPx: (W + 2) / r.width };
  };

  const snapped = (piece: number, rawX: number, rawY: number, unitsPerPx: number) => {
    const s = play.pieces[piece]!;
    const { xs, ys } = stopsFor(play.frame, s, others(piece));
    const reach = 14 * unitsPerPx; // within 14 pixels of an edge place, take it
    const clamp = (v: number, max: number) => Math.max(0, Math.min(max, v));
    return { x: clamp(snap(rawX, xs, reach), W - s), y: clamp(snap(rawY, ys, reach), H - s) };
  };

  // ---- pointer and touch ------------------------------------------------------------------
  const onPiecePointerDown = (e: ReactPointerEvent, piece: number, from: 'tray' | 'board') => {
    if (locked || e.button !== 0) return;
    (e.currentTarget as Element).setPointerCapture(e.pointerId);
    pointerStart.current = { x: e.clientX, y: e.clientY, piece, from };
  };

  const onPiecePointerMove = (e: ReactPointerEvent) => {
    const start = pointerStart.current;
    if (!start) return;
    const moved = Math.hypot(e.clientX - start.x, e.clientY - start.y) > 5;
    if (!moved && !held?.dragging) return;
    const u = toUnits(e.clientX, e.clientY);
    if (!u) return;
    const s = play.pieces[start.piece]!;
    let offset = held?.dragging ? held.offset : { x: s / 2, y: s / 2 };
    if (!held?.dragging && start.from === 'board') {
      const p0 = placedBy.get(start.piece)!;
      const u0 = toUnits(start.x, start.y);
      if (u0) offset = { x: u0.x - p0.x, y: u0.y - p0.y };
    }
    const at = snapped(start.piece, u.x - offset.x, u.y - offset.y, u.unitsPerPx);
    setHeld({ piece: start.piece, ...at, from: start.from, dragging: true, offset });
    onSelect(start.piece);
  };

  const onPiecePointerUp = (e: ReactPointerEvent) => {
    e.stopPropagation(); // not a tap on the frame as well
    const start = pointerStart.current;
    pointerStart.current = null;
    if (!start) return;
    if (!held?.dragging) {
      // a tap: pick the piece up; the next tap on the frame puts it down
      pickUp(start.piece, start.from);
      return;
    }
    const u = toUnits(e.clientX, e.clientY);
    if (!u || !u.inside) {
      setHeld(null);
      if (start.from === 'board') {
        onRemove(start.piece);
        onMessage(`Piece ${play.pieces[start.piece]} is back in the tray.`);
      }
      return;
    }
    // the piece goes where the finger or pointer left it (the last move may not have been drawn yet)
    const at = snapped(start.piece, u.x - held.offset.x, u.y - held.offset.y, u.unitsPerPx);
    if (!putDown({ ...held, ...at })) setHeld(null);
  };

  const onBoardPointerUp = (e: ReactPointerEvent) => {
    // a tap on the frame while a piece is held (picked up by a tap or the keyboard)
    if (!held || held.dragging || pointerStart.current) return;
    const u = toUnits(e.clientX, e.clientY);
    if (!u || !u.inside) return;
    const s = play.pieces[held.piece]!;
    const at = snapped(held.piece, u.x - s / 2, u.y - s / 2, u.unitsPerPx);
    putDown({ ...held, ...at });
  };

  // ---- keyboard ---------------------------------------------------------------------------
  const onBoardKeyDown = (e: KeyboardEvent) => {
    if (!held || locked) return;
    const s = play.pieces[held.piece]!;
    const { xs, ys } = stopsFor(play.frame, s, others(held.piece));
    const move = (x: number, y: number) => {
      e.preventDefault();
      setHeld({ ...held, x, y });
      onMessage(`Piece ${s} at ${x}, ${y}${validAt(held.piece, x, y) ? '' : ' (overlaps)'}.`);
    };
    if (e.key === 'ArrowRight') move(step(held.x, xs, 1), held.y);
    else if (e.key === 'ArrowLeft') move(step(held.x, xs, -1), held.y);
    else if (e.key === 'ArrowDown') move(held.x, step(held.y, ys, 1));
    else if (e.key === 'ArrowUp') move(held.x, step(held.y, ys, -1));
    else if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      putDown(held);
    } else if (e.key === 'Escape') {
      e.preventDefault();
      setHeld(null);
      onMessage(held.from === 'board' ? `Piece ${s} stays where it was.` : `Piece ${s} is back in the tray.`);
    } else if ((e.key === 'Delete' || e.key === 'Backspace') && held.from === 'board') {
      e.preventDefault();
      setHeld(null);
      onRemove(held.piece);
      onMessage(`Piece ${s} is back in the tray.`);
    }
  };

  const onPlacedKeyDown = (e: KeyboardEvent, piece: number) => {
    if (locked) return;
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      e.stopPropagation();
      pickUp(piece, 'board');
    } else if (e.key === 'Delete' || e.key === 'Backspace') {
      e.preventDefault();
      e.stopPropagation();
      onRemove(piece);
      onMessage(`Piece ${play.pieces[piece]} is back in the tray.`);
    }
  };

  const label = (s: number) => Math.max(W, H) / 40 > s * 0.45 ? '' : String(s);
  const fontSize = (s: number) => Math.min(s * 0.42, Math.max(W, H) / 10);
  const heldValid = held ? validAt(held.piece, held.x, held.y) : true;

  return (
    <div className="space-y-3">
      <svg
        ref={svg}
        role="application"
        aria-roledescription="Assembly board"
        aria-label={held ? `Frame ${W} by ${H}. Piece ${play.pieces[held.piece]} held at ${held.x}, ${held.y}: arrow keys move it, Enter puts it down, Escape puts it back.` : `Frame ${W} by ${H}, ${placements.length + play.starters.length} of ${play.pieces.length} pieces placed.`}
        tabIndex={held ? 0 : -1}
        viewBox={`-1 -1 ${W + 2} ${H + 2}`}
        className="block h-auto w-full touch-none select-none rounded border border-rule bg-surface"
        onKeyDown={onBoardKeyDown}
        onPointerUp={onBoardPointerUp}
        data-testid="assembly-board"
      >
        <rect x={0} y={0} width={W} height={H} fill="#fffdf9" stroke={INK} strokeWidth={2} vectorEffect="non-scaling-stroke" />
        {onBoard.map((q) => {
          const isHeld = held?.piece === q.piece;
          const isWrong = wrong.has(q.piece);
          return (
            <g
              key={q.piece}
              role={q.starter ? 'img' : 'button'}
              tabIndex={q.starter || locked ? undefined : 0}
              aria-label={`${[label(q.s), isWrong && label(q.s) ? '\u2715' : ''].filter(Boolean).join(' ')}${label(q.s) ? ': ' : ''}${q.starter ? `starter piece ${q.s}, fixed at ${q.x}, ${q.y}` : `piece ${q.s} at ${q.x}, ${q.y}${isWrong ? ', wrong' : ''}. Enter to move it, Delete to remove it.`}`}
              data-piece={q.piece}
              data-size={q.s}
              className={q.starter || locked ? '' : 'cursor-grab focus:outline-none'}
              opacity={isHeld && held?.dragging ? 0.35 : 1}
              onPointerDown={q.starter ? undefined : (e) => onPiecePointerDown(e, q.piece, 'board')}
              onPointerMove={q.starter ? undefined : onPiecePointerMove}
              onPointerUp={q.starter ? undefined : onPiecePointerUp}
              onKeyDown={q.starter ? undefined : (e) => onPlacedKeyDown(e, q.piece)}
            >
              <rect
                x={q.x}
                y={q.y}
                width={q.s}
                height={q.s}
                fill={q.starter ? '#e0d9cc' : isWrong ? '#f6e1de' : selected === q.piece ? '#e9c9b6' : '#efeae0'}
                stroke={isWrong ? '#a23a32' : INK}
                strokeWidth={isWrong ? 3 : 1}
                vectorEffect="non-scaling-stroke"
              />
              <text aria-hidden="true" x={q.x + q.s / 2} y={q.y + q.s / 2} fontSize={fontSize(q.s)} textAnchor="middle" dominantBaseline="central" fill={isWrong ? '#a23a32' : INK} fontWeight={q.starter ? 700 : 400}>
                {[label(q.s), isWrong && label(q.s) ? '\u2715' : ''].filter(Boolean).join(' ')}
              </text>
            </g>
          );
        })}
        {held ? (
          <rect
            x={held.x}
            y={held.y}
            width={play.pieces[held.piece]}
            height={play.pieces[held.piece]}
            fill={heldValid ? 'rgba(181,82,43,0.25)' : 'rgba(162,58,50,0.25)'}
            stroke={heldValid ? '#96411f' : '#a23a32'}
            strokeWidth={3}
            strokeDasharray={heldValid ? undefined : '6 4'}
            vectorEffect="non-scaling-stroke"
            pointerEvents="none"
            data-testid="held-piece"
          />
        ) : null}
      </svg>
      <div>
        <h2 className="text-sm font-semibold text-ink-soft">{tray.length === 0 ? 'Every piece is on the board' : `Pieces to place (${tray.length})`}</h2>
        <ul className="mt-1 flex flex-wrap items-end gap-2" aria-label="Pieces to place">
          {tray.map(({ piece, s }) => {
            const px = Math.round(28 + 36 * Math.sqrt(s / largest));
            return (
              <li key={piece}>
                <button
                  type="button"
                  disabled={locked}
                  aria-pressed={held?.piece === piece}
                  aria-label={`Piece ${s}`}
                  data-piece={piece}
                  data-size={s}
                  className={`flex touch-none items-center justify-center rounded-sm border text-sm font-semibold tabular ${held?.piece === piece ? 'border-accent-strong bg-accent-soft' : 'border-ink bg-paper-deep'} disabled:opacity-50`}
                  style={{ width: px, height: px }}
                  onPointerDown={(e) => onPiecePointerDown(e, piece, 'tray')}
                  onPointerMove={onPiecePointerMove}
                  onPointerUp={onPiecePointerUp}
                  onKeyDown={(e) => {
                    if (e.key === 'Enter' || e.key === ' ') {
                      e.preventDefault();
                      pickUp(piece, 'tray');
                    }
                  }}
                >
                  {s}
                </button>
              </li>
            );
          })}
        </ul>
      </div>
    </div>
  );
}
