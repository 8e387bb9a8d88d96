import { useMemo, useRef, useState, type PointerEvent } from 'react';
import { Link } from 'react-router-dom';
import { planeGraphFromDrawing, solvePlaneNetwork, TilingInputError, type Tiling } from '../../../../shared/tiling/index';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { tilingPalette } from '../../../components/tiling-palette';
import { useCreateSubmission } from '../api/create-submission';

type Mode = 'nodes' | 'edges' | 'poles';
interface Pt { x: number; y: number }

const VIEW_W = 480;
const VIEW_H = 360;
const R = 9;

type Outcome =
  | { kind: 'empty'; message: string }
  | { kind: 'error'; message: string; edges?: [number, number] }
  | { kind: 'ok'; tiling: Tiling; spanningTrees: bigint };

/** Solve the sketch with Kirchhoff's laws, in the browser (the engine in shared/ is pure). */
export function solveSketch(nodes: Pt[], edges: [number, number][], poles: [number, number] | null): Outcome {
  if (nodes.length < 2 || edges.length < 2) return { kind: 'empty', message: 'Place at least three nodes and join them with edges.' };
  const g = planeGraphFromDrawing(nodes, edges);
  if (g instanceof TilingInputError) {
    const e = g.where?.edges;
    return e ? { kind: 'error', message: g.message, edges: e } : { kind: 'error', message: g.message };
  }
  if (!poles) return { kind: 'empty', message: 'Choose the two poles: the ends of the edge that is the battery.' };
  const r = solvePlaneNetwork(g, { p: poles[0], q: poles[1] });
  if (!r.ok) {
    const why: Record<string, string> = {
      'zero-current': 'Some edge carries no current with these poles, so it would be a square of size 0. Move an edge or choose other poles.',
      disconnected: 'The drawing is not connected: every node must be reachable from every other.',
      'not-plane': 'The drawing is not a plane network.',
      'bad-pole': 'The two poles must be joined by an edge (the battery).',
      'too-large': 'The network is too large to solve here.',
    };
    return { kind: 'error', message: `${why[r.code] ?? ''} (${r.message})`.trim() };
  }
  return { kind: 'ok', tiling: r.tiling, spanningTrees: r.spanningTrees };
}

/** Sketch a network: place nodes, draw edges, choose the poles; the tiling appears beside it. */
export function SketchTab() {
  const [nodes, setNodes] = useState<Pt[]>([]);
  const [edges, setEdges] = useState<[number, number][]>([]);
  const [poles, setPoles] = useState<[number, number] | null>(null);
  const [pendingPole, setPendingPole] = useState<number | null>(null);
  const [mode, setMode] = useState<Mode>('nodes');
  const [dragFrom, setDragFrom] = useState<number | null>(null);
  const [cursor, setCursor] = useState<Pt | null>(null);
  const svg = useRef<SVGSVGElement>(null);
  const create = useCreateSubmission();
  const outcome = useMemo(() => solveSketch(nodes, edges, poles), [nodes, edges, poles]);

  function point(e: PointerEvent): Pt {
    const r = svg.current?.getBoundingClientRect();
    if (!r || r.width === 0) return { x: 0, y: 0 };
    return { x: Math.round(((e.clientX - r.left) / r.width) * VIEW_W), y: Math.round(((e.clientY - r.top) / r.height) * VIEW_H) };
  }
  const nodeAt = (p: Pt) => nodes.findIndex((n) => (n.x - p.x) ** 2 + (n.y - p.y) ** 2 <= (R * 1.6) ** 2);
  function addEdge(a: number, b: number) {
    if (a === b || edges.some(([u, v]) => (u === a && v === b) || (u === b && v === a))) return;
    setEdges([...edges, [a, b]]);
  }
  function onDown(e: PointerEvent) {
    const p = point(e);
    const i = nodeAt(p);
    if (mode === 'nodes') {
      if (i < 0) setNodes([...nodes, p]);
    } else if (mode === 'edges') {
      if (i >= 0) {
        if (dragFrom !== null && dragFrom !== i) {
          addEdge(dragFrom, i);
          setDragFrom(null);
        } else setDragFrom(i);
      }
    } else if (i >= 0) {
      if (pendingPole === null) {
        setPendingPole(i);
        setPoles(null);
      } else {
        setPoles([pendingPole, i]);
        setPendingPole(null);
      }
    }
  }
  function onUp(e: PointerEvent) {
    if (mode !== 'edges' || dragFrom === null) return;
    const i = nodeAt(point(e));
    if (i >= 0 && i !== dragFrom) {
      addEdge(dragFrom, i);
      setDragFrom(null);
    }
  }
  function clear() {
    setNodes([]);
    setEdges([]);
    setPoles(null);
    setPendingPole(null);
    setDragFrom(null);
  }
  function submit() {
    if (outcome.kind !== 'ok') return;
    const t = outcome.tiling;
    create.mutate({ source: 'sketch', squares: { width: t.W, height: t.H, squares: t.squares.map((q) => ({ x: q.x, y: q.y, size: q.s })) } });
  }
  const crossing = outcome.kind === 'error' ? outcome.edges : undefined;
  const modes: { id: Mode; label: string; help: string }[] = [
    { id: 'nodes', label: 'Place nodes', help: 'Click on the canvas to place a node.' },
    { id: 'edges', label: 'Draw edges', help: 'Drag from one node to another (or click one, then the other) to join them.' },
    { id: 'poles', label: 'Choose poles', help: 'Click the top pole, then the bottom pole; they must be joined by an edge.' },
  ];

  return (
    <div className="grid gap-6 lg:grid-cols-2">
      <div className="flex flex-col gap-3">
        <fieldset className="flex flex-wrap gap-3">
          <legend className="mb-1 text-sm font-semibold text-ink">Tool</legend>
          {modes.map((m) => (
            <label key={m.id} className="flex items-center gap-1.5 text-sm">
              <input type="radio" name="sketch-mode" checked={mode === m.id} onChange={() => setMode(m.id)} />
              {m.label}
            </label>
          ))}
        </fieldset>
        <p className="text-sm text-ink-muted">{modes.find((m) => m.id === mode)?.help}</p>
        <svg
          ref={svg}
          role="application"
          aria-label={`Network sketch: ${nodes.length} nodes, ${edges.length} edges`}
          viewBox={`0 0 ${VIEW_W} ${VIEW_H}`}
          className="w-full touch-none rounded-lg border border-rule-strong bg-surface"
          onPointerDown={onDown}
          onPointerUp={onUp}
          onPointerMove={(e) => setCursor(point(e))}
        >
          {edges.map(([a, b], i) => {
            const p = nodes[a]!;
            const q = nodes[b]!;
            const isPole = poles && ((poles[0] === a && poles[1] === b) || (poles[0] === b && poles[1] === a));
            const bad = crossing && (crossing[0] === i || crossing[1] === i);
            return (
              <line key={i} data-edge={i} x1={p.x} y1={p.y} x2={q.x} y2={q.y} stroke={bad ? '#a23a32' : isPole ? tilingPalette.accent : tilingPalette.ink} strokeWidth={bad || isPole ? 4 : 2} strokeDasharray={isPole ? '8 5' : undefined} />
            );
          })}
          {mode === 'edges' && dragFrom !== null && cursor ? (
            <line x1={nodes[dragFrom]!.x} y1={nodes[dragFrom]!.y} x2={cursor.x} y2={cursor.y} stroke={tilingPalette.muted} strokeDasharray="4 4" />
          ) : null}
          {nodes.map((n, i) => {
            const role = poles?.[0] === i || pendingPole === i ? '+' : poles?.[1] === i ? '−' : null;
            return (
              <g key={i} data-node={i}>
                <circle cx={n.x} cy={n.y} r={R} fill={role ? tilingPalette.accentFill : tilingPalette.paper} stroke={dragFrom === i ? tilingPalette.accent : tilingPalette.ink} strokeWidth={2} />
                <text x={n.x} y={n.y} fontSize={10} textAnchor="middle" dominantBaseline="central">{role ?? i + 1}</text>
              </g>
            );
          })}
          {outcome.kind === 'error' ? (
            <text x={8} y={VIEW_H - 10} fontSize={12} fill="#a23a32">
              {crossing ? `Edges ${crossing[0] + 1} and ${crossing[1] + 1} cross: move a node.` : outcome.message.slice(0, 80)}
            </text>
          ) : null}
        </svg>
        <div>
          <Button onClick={clear}>Clear the sketch</Button>
        </div>
      </div>
      <section aria-label="Tiling from the sketch" aria-live="polite" className="flex flex-col gap-3">
        {outcome.kind === 'empty' ? <p className="text-sm text-ink-muted">{outcome.message}</p> : null}
        {outcome.kind === 'error' ? <Alert tone="danger" title="No tiling from this sketch">{outcome.message}</Alert> : null}
        {outcome.kind === 'ok' ? (
          <>
            <div className="max-w-md rounded-md border border-rule bg-surface p-2">
              <TilingDrawing tiling={outcome.tiling} />
            </div>
            <p className="text-sm text-ink">
              {outcome.tiling.W} × {outcome.tiling.H}, {outcome.tiling.squares.length} squares (the network has {outcome.spanningTrees.toString()} spanning trees).
            </p>
            <div>
              <Button variant="primary" onClick={submit} busy={create.isPending}>Submit this tiling</Button>
            </div>
          </>
        ) : null}
        {create.isSuccess ? <Alert tone="success" title="Submitted">Follow it on <Link to="/submissions">My submissions</Link>.</Alert> : null}
        <ErrorAlert error={create.error} title="Not submitted" />
      </section>
    </div>
  );
}
