import { useId, useMemo, useRef, useState, type KeyboardEvent, type PointerEvent } from 'react';
import { Link } from 'react-router-dom';
import { MAX_NOTE, MAX_TITLE } from '../../../../shared/contracts/submissions';
import { planeGraphFromDrawing, solvePlaneNetwork, TilingInputError, type Tiling } from '../../../../shared/tiling/index';
import { Alert, ErrorAlert } from '../../../components/alert';
import { Button } from '../../../components/button';
import { controlClasses } from '../../../components/field';
import { SelectField } from '../../../components/select-field';
import { TextField } from '../../../components/text-field';
import { TilingDrawing } from '../../../components/tiling-drawing';
import { tilingPalette } from '../../../components/tiling-palette';
import { useCreateSubmission } from '../api/create-submission';

type Mode = 'nodes' | 'edges' | 'poles';
interface Pt { x: number; y: number }
/** The whole drawing: what one undo step restores. Nodes and edges are numbered from 1 on screen, in the order drawn. */
export interface Sketch { nodes: Pt[]; edges: [number, number][]; poles: [number, number] | null }

const VIEW_W = 480;
const VIEW_H = 360;
const R = 9;
/** A keyboard move of a node, in canvas units (Shift: a fine step). */
const STEP = 10;
const FINE_STEP = 2;

type Outcome =
  | { kind: 'empty'; message: string }
  | { kind: 'error'; message: string; edges?: [number, number] }
  | { kind: 'ok'; tiling: Tiling; spanningTrees: bigint };

/** "node 3", "nodes 3 and 5": the engine counts from 0, the screen from 1. */
const nodeName = (i: number) => `node ${i + 1}`;

/** The engine's reason, in the screen's numbering (nodes and edges from 1). */
function inOurNumbers(code: string, message: string, poles: [number, number]): string {
  const pair = /edge (\d+)-(\d+)/.exec(message);
  const between = pair ? `the edge between ${nodeName(Number(pair[1]))} and ${nodeName(Number(pair[2]))}` : 'an edge';
  switch (code) {
    case 'zero-current':
      return `${between[0]!.toUpperCase()}${between.slice(1)} carries no current with these poles, so it would be a square of size 0. Move an edge or choose other poles.`;
    case 'disconnected':
      return `The network is not connected without the pole edge (between ${nodeName(poles[0])} and ${nodeName(poles[1])}): every node must be reachable from every other by the other edges.`;
    case 'not-plane':
      return 'The drawing is not a plane network: move nodes so that no two edges cross.';
    case 'bad-pole':
      return poles[0] === poles[1] ? 'The two poles must be different nodes.' : `The two poles (${nodeName(poles[0])} and ${nodeName(poles[1])}) must be joined by an edge (the battery).`;
    case 'too-large':
      return 'The network is too large to solve here.';
    default:
      return 'This sketch gives no tiling.';
  }
}

/** A drawing error (two nodes on one point, a bad edge), in the screen's numbering. */
function drawingMessage(message: string): string {
  return message
    .replace(/\bnodes (\d+) and (\d+)/g, (_, a: string, b: string) => `nodes ${Number(a) + 1} and ${Number(b) + 1}`)
    .replace(/\bnode (\d+)/g, (_, a: string) => `node ${Number(a) + 1}`)
    .replace(/\bedge (\d+)/g, (_, a: string) => `edge ${Number(a) + 1}`);
}

/** Solve the sketch with Kirchhoff's laws, in the browser (the engine in shared/ is pure). Messages number nodes and edges from 1, as the canvas does. */
export function solveSketch(nodes: Pt[], edges: [number, number][], poles: [number, number] | null): Outcome {
  if (nodes.length < 2 || edges.length < 2) return { kind: 'empty', message: 'Place at least three nodes and join them with edges.' };
  const g = planeGraphFromDrawing(nodes, edges);
  if (g instanceof TilingInputError) {
    const e = g.where?.edges;
    return e ? { kind: 'error', message: `Edges ${e[0] + 1} and ${e[1] + 1} cross: move a node so that they do not.`, edges: e } : { kind: 'error', message: drawingMessage(g.message) };
  }
  if (!poles) return { kind: 'empty', message: 'Choose the two poles: the top and the bottom of the rectangle. Their edge (the battery) is drawn for you if it is missing.' };
  const r = solvePlaneNetwork(g, { p: poles[0], q: poles[1] });
  if (!r.ok) return { kind: 'error', message: inOurNumbers(r.code, r.message, poles) };
  return { kind: 'ok', tiling: r.tiling, spanningTrees: r.spanningTrees };
}

const joined = (edges: [number, number][], a: number, b: number) => edges.some(([u, v]) => (u === a && v === b) || (u === b && v === a));

/** Poles chosen: the battery edge between them is added when the sketch lacks it. */
export function withPoles(s: Sketch, top: number, bottom: number): Sketch {
  if (top === bottom) return s;
  return { ...s, poles: [top, bottom], edges: joined(s.edges, top, bottom) ? s.edges : [...s.edges, [top, bottom]] };
}

/** A free place for a node added from the keyboard: the first point of a coarse grid, from the middle outwards, clear of every node. */
export function freePlace(nodes: Pt[]): Pt {
  const spots: Pt[] = [];
  for (let y = 40; y <= VIEW_H - 40; y += 40) for (let x = 40; x <= VIEW_W - 40; x += 40) spots.push({ x, y });
  spots.sort((a, b) => (a.x - VIEW_W / 2) ** 2 + (a.y - VIEW_H / 2) ** 2 - ((b.x - VIEW_W / 2) ** 2 + (b.y - VIEW_H / 2) ** 2));
  return spots.find((p) => nodes.every((n) => (n.x - p.x) ** 2 + (n.y - p.y) ** 2 > (3 * R) ** 2)) ?? { x: VIEW_W / 2, y: VIEW_H / 2 };
}

const empty: Sketch = { nodes: [], edges: [], poles: null };
const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/**
 * Sketch a network: place nodes, join them, choose the poles; the tiling appears beside it.
 * By pointer on the canvas, or by keyboard: "Add a node", each node is focusable and moves with
 * the arrow keys (Enter joins or chooses it, as the tool says), the join and pole pickers name
 * nodes by number, every edge is listed with its Remove button, and Undo takes back one change.
 */
export function SketchTab() {
  const [sketch, setSketch] = useState<Sketch>(empty);
  const [history, setHistory] = useState<Sketch[]>([]);
  const [pendingPole, setPendingPole] = useState<number | null>(null);
  const [mode, setMode] = useState<Mode>('nodes');
  const [dragFrom, setDragFrom] = useState<number | null>(null);
  const [cursor, setCursor] = useState<Pt | null>(null);
  const [joinFrom, setJoinFrom] = useState('');
  const [joinTo, setJoinTo] = useState('');
  const [poleTop, setPoleTop] = useState('');
  const [poleBottom, setPoleBottom] = useState('');
  const [title, setTitle] = useState('');
  const [note, setNote] = useState('');
  const [said, setSaid] = useState('');
  const noteId = useId();
  const svg = useRef<SVGSVGElement>(null);
  const create = useCreateSubmission();
  const { nodes, edges, poles } = sketch;
  const outcome = useMemo(() => solveSketch(nodes, edges, poles), [nodes, edges, poles]);

  /** One change of the drawing, undoable; `words` is announced to screen readers. */
  function change(next: Sketch, words: string) {
    if (next === sketch) return;
    setHistory((h) => [...h.slice(-199), sketch]);
    setSketch(next);
    setSaid(words);
  }
  function undo() {
    const last = history.at(-1);
    if (!last) return;
    setHistory((h) => h.slice(0, -1));
    setSketch(last);
    setPendingPole(null);
    setDragFrom(null);
    setSaid('Undone: the last change is taken back.');
  }
  function point(e: PointerEvent): Pt {
    const r = svg.current?.getBoundingClientRect();
    if (!r || r.width === 0) return { x: 0, y: 0 };
    return { x: Math.round(((e.clientX - r.left) / r.width) * VIEW_W), y: Math.round(((e.clientY - r.top) / r.height) * VIEW_H) };
  }
  const nodeAt = (p: Pt) => nodes.findIndex((n) => (n.x - p.x) ** 2 + (n.y - p.y) ** 2 <= (R * 1.6) ** 2);
  function addNode(p: Pt) {
    change({ ...sketch, nodes: [...nodes, p] }, `Node ${nodes.length + 1} added.`);
  }
  function addEdge(a: number, b: number) {
    if (a === b) return;
    if (joined(edges, a, b)) return setSaid(`Nodes ${a + 1} and ${b + 1} are already joined.`);
    change({ ...sketch, edges: [...edges, [a, b]] }, `Edge ${edges.length + 1} joins nodes ${a + 1} and ${b + 1}.`);
  }
  function removeEdge(i: number) {
    const [a, b] = edges[i]!;
    const next = edges.filter((_, k) => k !== i);
    const polesGone = poles && ((poles[0] === a && poles[1] === b) || (poles[0] === b && poles[1] === a));
    change({ ...sketch, edges: next, poles: polesGone ? null : poles }, `Edge between nodes ${a + 1} and ${b + 1} removed; edges are numbered again from 1.${polesGone ? ' It was the pole edge: choose the poles again.' : ''}`);
  }
  function setPoles(top: number, bottom: number) {
    if (top === bottom) return setSaid('The two poles must be different nodes.');
    const next = withPoles(sketch, top, bottom);
    change(next, `Poles: node ${top + 1} at the top, node ${bottom + 1} at the bottom.${next.edges.length > edges.length ? ` Their edge (the battery) is added as edge ${next.edges.length}.` : ''}`);
  }
  function pick(i: number) {
    if (mode === 'edges') {
      if (dragFrom !== null && dragFrom !== i) {
        addEdge(dragFrom, i);
        setDragFrom(null);
      } else {
        setDragFrom(i);
        setSaid(`Node ${i + 1} chosen: now choose the node to join it to.`);
      }
    } else if (mode === 'poles') {
      if (pendingPole === null) {
        setPendingPole(i);
        setSaid(`Node ${i + 1} is the top pole: now choose the bottom pole.`);
      } else {
        setPoles(pendingPole, i);
        setPendingPole(null);
      }
    }
  }
  function onDown(e: PointerEvent) {
    const p = point(e);
    const i = nodeAt(p);
    if (mode === 'nodes') {
      if (i < 0) addNode(p);
    } else if (i >= 0) pick(i);
  }
  function onUp(e: PointerEvent) {
    if (mode !== 'edges' || dragFrom === null) return;
    const i = nodeAt(point(e));
    if (i >= 0 && i !== dragFrom) {
      addEdge(dragFrom, i);
      setDragFrom(null);
    }
  }
  function onNodeKey(e: KeyboardEvent, i: number) {
    const step = e.shiftKey ? FINE_STEP : STEP;
    const moves: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
    const m = moves[e.key];
    if (m) {
      e.preventDefault();
      const n = nodes[i]!;
      const p = { x: clamp(n.x + m[0], R, VIEW_W - R), y: clamp(n.y + m[1], R, VIEW_H - R) };
      change({ ...sketch, nodes: nodes.map((q, k) => (k === i ? p : q)) }, `Node ${i + 1} at ${p.x}, ${p.y}.`);
    } else if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      if (mode === 'nodes') setSaid('Choose the tool “Draw edges” or “Choose poles” first, or use the pickers below.');
      else pick(i);
    }
  }
  function onCanvasKey(e: KeyboardEvent) {
    if ((e.ctrlKey || e.metaKey) && e.key.toLowerCase() === 'z') {
      e.preventDefault();
      undo();
    }
  }
  function clear() {
    change(empty, 'The sketch is cleared.');
    setPendingPole(null);
    setDragFrom(null);
  }
  function submit() {
    if (outcome.kind !== 'ok') return;
    const t = outcome.tiling;
    create.mutate({
      source: 'sketch',
      squares: { width: t.W, height: t.H, squares: t.squares.map((q) => ({ x: q.x, y: q.y, size: q.s })) },
      ...(title.trim() ? { title: title.trim() } : {}),
      ...(note.trim() ? { note: note.trim() } : {}),
    });
  }
  const crossing = outcome.kind === 'error' ? outcome.edges : undefined;
  const modes: { id: Mode; label: string; help: string }[] = [
    { id: 'nodes', label: 'Place nodes', help: 'Click on the canvas to place a node, or press “Add a node”. A focused node moves with the arrow keys (Shift for small steps).' },
    { id: 'edges', label: 'Draw edges', help: 'Drag from one node to another (or click or press Enter on one, then on the other) to join them.' },
    { id: 'poles', label: 'Choose poles', help: 'Click or press Enter on the top pole, then on the bottom pole; their edge (the battery) is added if it is missing.' },
  ];
  const nodeOptions = nodes.map((_, i) => ({ value: String(i), label: `Node ${i + 1}` }));
  const poleOf = (i: number) => (poles?.[0] === i || (pendingPole === i && !poles) ? 'top pole' : poles?.[1] === i ? 'bottom pole' : null);

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
          aria-label={`Network sketch: ${nodes.length} nodes, ${edges.length} edges${poles ? `, poles ${poles[0] + 1} and ${poles[1] + 1}` : ''}`}
          viewBox={`0 0 ${VIEW_W} ${VIEW_H}`}
          className="w-full touch-none rounded-lg border border-rule-strong bg-surface"
          onPointerDown={onDown}
          onPointerUp={onUp}
          onPointerMove={(e) => setCursor(point(e))}
          onKeyDown={onCanvasKey}
        >
          {edges.map(([a, b], i) => {
            const p = nodes[a]!;
            const q = nodes[b]!;
            const isPole = poles && ((poles[0] === a && poles[1] === b) || (poles[0] === b && poles[1] === a));
            const bad = crossing && (crossing[0] === i || crossing[1] === i);
            return (
              <g key={i} data-edge={i}>
                <line x1={p.x} y1={p.y} x2={q.x} y2={q.y} stroke={bad ? '#a23a32' : isPole ? tilingPalette.accent : tilingPalette.ink} strokeWidth={bad || isPole ? 4 : 2} strokeDasharray={isPole ? '8 5' : undefined} />
                <text x={(p.x + q.x) / 2 + 6} y={(p.y + q.y) / 2 - 6} fontSize={10} fill={tilingPalette.muted} aria-hidden>
                  {`e${i + 1}`}
                </text>
              </g>
            );
          })}
          {mode === 'edges' && dragFrom !== null && cursor ? (
            <line x1={nodes[dragFrom]!.x} y1={nodes[dragFrom]!.y} x2={cursor.x} y2={cursor.y} stroke={tilingPalette.muted} strokeDasharray="4 4" />
          ) : null}
          {nodes.map((n, i) => {
            const role = poleOf(i);
            return (
              <g
                key={i}
                data-node={i}
                tabIndex={0}
                role="button"
                aria-label={`Node ${i + 1}${role ? `, ${role}` : ''}${dragFrom === i ? ', chosen to join' : ''}, at ${n.x}, ${n.y}`}
                onKeyDown={(e) => onNodeKey(e, i)}
                className="focus-visible:outline-none [&:focus-visible>circle]:stroke-focus [&:focus-visible>circle]:[stroke-width:4]"
              >
                <circle cx={n.x} cy={n.y} r={R} fill={role ? tilingPalette.accentFill : tilingPalette.paper} stroke={dragFrom === i ? tilingPalette.accent : tilingPalette.ink} strokeWidth={2} />
                <text x={n.x} y={n.y} fontSize={10} textAnchor="middle" dominantBaseline="central" aria-hidden>
                  {i + 1}
                </text>
                {role ? (
                  <text x={n.x + R + 2} y={n.y - R} fontSize={12} fontWeight="bold" fill={tilingPalette.accent} aria-hidden>
                    {role === 'top pole' ? '+' : '−'}
                  </text>
                ) : null}
              </g>
            );
          })}
        </svg>
        <p className="sr-only" aria-live="polite">
          {said}
        </p>
        {outcome.kind === 'error' ? <Alert tone="danger" title="No tiling from this sketch">{outcome.message}</Alert> : null}
        <div className="flex flex-wrap gap-2">
          <Button onClick={() => addNode(freePlace(nodes))}>Add a node</Button>
          <Button onClick={undo} disabled={history.length === 0} aria-keyshortcuts="Control+Z">
            Undo
          </Button>
          <Button onClick={clear} disabled={nodes.length === 0}>Clear the sketch</Button>
        </div>
        {nodes.length >= 2 ? (
          <div className="flex flex-col gap-3 rounded-md border border-rule p-3">
            <div className="flex flex-wrap items-end gap-2">
              <SelectField label="Join node" placeholder="Choose…" value={joinFrom} onChange={(e) => setJoinFrom(e.target.value)} options={nodeOptions} />
              <SelectField label="to node" placeholder="Choose…" value={joinTo} onChange={(e) => setJoinTo(e.target.value)} options={nodeOptions} />
              <Button disabled={joinFrom === '' || joinTo === '' || joinFrom === joinTo} onClick={() => addEdge(Number(joinFrom), Number(joinTo))}>
                Join
              </Button>
            </div>
            <div className="flex flex-wrap items-end gap-2">
              <SelectField label="Top pole" placeholder="Choose…" value={poleTop} onChange={(e) => setPoleTop(e.target.value)} options={nodeOptions} />
              <SelectField label="Bottom pole" placeholder="Choose…" value={poleBottom} onChange={(e) => setPoleBottom(e.target.value)} options={nodeOptions} />
              <Button disabled={poleTop === '' || poleBottom === '' || poleTop === poleBottom} onClick={() => setPoles(Number(poleTop), Number(poleBottom))}>
                Set the poles
              </Button>
            </div>
          </div>
        ) : null}
        {edges.length > 0 ? (
          <ol aria-label="Edges" className="flex flex-col gap-1 text-sm">
            {edges.map(([a, b], i) => {
              const isPole = poles && ((poles[0] === a && poles[1] === b) || (poles[0] === b && poles[1] === a));
              return (
                <li key={`${a}-${b}`} className="flex items-center gap-2">
                  <span>{`Edge ${i + 1}: node ${a + 1} – node ${b + 1}${isPole ? ' (the pole edge)' : ''}`}</span>
                  <Button size="sm" aria-label={`Remove edge ${i + 1}`} onClick={() => removeEdge(i)}>
                    Remove
                  </Button>
                </li>
              );
            })}
          </ol>
        ) : null}
      </div>
      <section aria-label="Tiling from the sketch" aria-live="polite" className="flex flex-col gap-3">
        {outcome.kind === 'empty' ? <p className="text-sm text-ink-muted">{outcome.message}</p> : null}
        {outcome.kind === 'ok' ? (
          <>
            <div className="max-w-md rounded-md border border-rule bg-surface p-2">
              <TilingDrawing tiling={outcome.tiling} />
            </div>
            <p className="text-sm text-ink">
              {outcome.tiling.W} × {outcome.tiling.H}, {outcome.tiling.squares.length} squares (the network has {outcome.spanningTrees.toString()} spanning trees).
            </p>
            <TextField label="Title (optional)" value={title} maxLength={MAX_TITLE} onChange={(e) => setTitle(e.target.value)} />
            <div className="flex flex-col gap-1">
              <label htmlFor={noteId} className="text-sm font-semibold text-ink">
                Note to the editor (optional)
              </label>
              <textarea id={noteId} value={note} maxLength={MAX_NOTE} onChange={(e) => setNote(e.target.value)} rows={3} className={`${controlClasses} h-auto`} />
            </div>
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
