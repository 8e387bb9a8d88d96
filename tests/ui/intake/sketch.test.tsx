import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it, vi } from 'vitest';
import { verifyTiling } from '../../../shared/tiling/index';
import { freePlace, SketchTab, solveSketch, withPoles } from '../../../src/features/submit/components/sketch-tab';

// The wheel W_4 drawn with straight edges: a hub and four rim nodes.
const nodes = [{ x: 240, y: 180 }, { x: 140, y: 80 }, { x: 340, y: 80 }, { x: 340, y: 280 }, { x: 140, y: 280 }];
const edges: [number, number][] = [[0, 1], [0, 2], [0, 3], [0, 4], [1, 2], [2, 3], [3, 4], [4, 1]];

describe('Sketch network: solving the drawing', () => {
  it('turns the wheel W4 with a rim pole edge into a verified tiling; its network has 45 spanning trees', () => {
    const r = solveSketch(nodes, edges, [1, 2]);
    if (r.kind !== 'ok') throw new Error(r.message);
    expect(verifyTiling(r.tiling)).toEqual({ ok: true });
    // 7 edges besides the pole edge: 7 squares
    expect(r.tiling.squares).toHaveLength(7);
    // OEIS A004146: the wheel with 4 rim vertices has 45 spanning trees (L(8) - 2, Lucas numbers)
    expect(r.spanningTrees).toBe(45n);
  });

  it('names the two crossing edges of a drawing that is not plane', () => {
    // a square with both diagonals and no centre node
    const r = solveSketch(nodes.slice(1), [[0, 2], [1, 3], [0, 1], [1, 2], [2, 3], [3, 0]], [0, 1]);
    expect(r).toMatchObject({ kind: 'error', edges: [0, 1] });
  });

  it('says so when the drawing is disconnected or the poles are not joined by an edge', () => {
    const apart = solveSketch([...nodes, { x: 450, y: 180 }, { x: 470, y: 200 }], [...edges, [5, 6]], [1, 2]);
    expect(apart).toMatchObject({ kind: 'error' });
    expect(apart.kind === 'error' && apart.message).toMatch(/not connected/);
    const notJoined = solveSketch(nodes, edges, [1, 3]);
    expect(notJoined.kind === 'error' && notJoined.message).toMatch(/joined by an edge/);
  });

  it('asks for more before there is a network, and for the poles before solving', () => {
    expect(solveSketch([], [], null).kind).toBe('empty');
    const noPoles = solveSketch(nodes, edges, null);
    expect(noPoles.kind === 'empty' && noPoles.message).toMatch(/poles/);
  });

  it('explains a zero current: the balanced Wheatstone bridge carries nothing across its bridge', () => {
    // Kirchhoff: with four equal resistors the bridge B-C joins two points of equal potential
    const bridge = [{ x: 100, y: 40 }, { x: 200, y: 150 }, { x: 300, y: 210 }, { x: 100, y: 320 }];
    const r = solveSketch(bridge, [[0, 1], [0, 2], [1, 3], [2, 3], [1, 2], [0, 3]], [0, 3]);
    expect(r.kind === 'error' && r.message).toMatch(/no current/);
  });

  it('numbers nodes from 1 in every message, as the canvas does', () => {
    // the engine counts from 0; the screen's node 2 is the engine's 1
    const notJoined = solveSketch(nodes, edges, [1, 3]);
    expect(notJoined.kind === 'error' && notJoined.message).toMatch(/node 2 and node 4/);
    const bridge = [{ x: 100, y: 40 }, { x: 200, y: 150 }, { x: 300, y: 210 }, { x: 100, y: 320 }];
    const r = solveSketch(bridge, [[0, 1], [0, 2], [1, 3], [2, 3], [1, 2], [0, 3]], [0, 3]);
    // the bridge is the edge between the engine's nodes 1 and 2: the screen's 2 and 3
    expect(r.kind === 'error' && r.message).toMatch(/between node 2 and node 3/);
    expect(r.kind === 'error' && r.message).not.toMatch(/\(/);
  });

  it('adds the pole edge (the battery) when the poles chosen are not joined, once', () => {
    const rim = edges.filter(([a, b]) => !(a === 1 && b === 2));
    const s = withPoles({ nodes, edges: rim, poles: null }, 1, 2);
    expect(s.edges).toHaveLength(edges.length);
    expect(s.poles).toEqual([1, 2]);
    expect(withPoles(s, 2, 1).edges).toHaveLength(edges.length);
    const solved = solveSketch(s.nodes, s.edges, s.poles);
    expect(solved.kind).toBe('ok');
  });

  it('places a node added from the keyboard clear of the others', () => {
    const placed: { x: number; y: number }[] = [];
    for (let i = 0; i < 12; i++) placed.push(freePlace(placed));
    for (let i = 0; i < placed.length; i++) for (let j = 0; j < i; j++) expect(Math.hypot(placed[i]!.x - placed[j]!.x, placed[i]!.y - placed[j]!.y)).toBeGreaterThan(20);
  });
});

describe('Sketch network: by keyboard alone', () => {
  it('adds and moves nodes, joins them, sets the poles (the battery edge drawn for it), undoes one change, and submits with a title and note', async () => {
    const sent: unknown[] = [];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (_input: unknown, init?: RequestInit) => {
        sent.push(init?.body ? JSON.parse(String(init.body)) : undefined);
        return new Response(JSON.stringify({ error: { code: 'bad_request', message: 'stopped here' } }), { status: 400, headers: { 'content-type': 'application/json' } });
      }),
    );
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
    render(
      <QueryClientProvider client={qc}>
        <MemoryRouter>
          <SketchTab />
        </MemoryRouter>
      </QueryClientProvider>,
    );
    const user = userEvent.setup();
    for (let i = 0; i < nodes.length; i++) await user.click(screen.getByRole('button', { name: 'Add a node' }));
    // move each node with the arrow keys to the wheel's place (steps of 10)
    for (let i = 0; i < nodes.length; i++) {
      const node = () => screen.getByRole('button', { name: new RegExp(`^Node ${i + 1}\\b`) });
      const at = /at (\d+), (\d+)$/.exec(node().getAttribute('aria-label') ?? '')!;
      const dx = (nodes[i]!.x - Number(at[1])) / 10;
      const dy = (nodes[i]!.y - Number(at[2])) / 10;
      for (let k = 0; k < Math.abs(dx); k++) fireEvent.keyDown(node(), { key: dx > 0 ? 'ArrowRight' : 'ArrowLeft' });
      for (let k = 0; k < Math.abs(dy); k++) fireEvent.keyDown(node(), { key: dy > 0 ? 'ArrowDown' : 'ArrowUp' });
      expect(node().getAttribute('aria-label')).toMatch(new RegExp(`at ${nodes[i]!.x}, ${nodes[i]!.y}$`));
    }
    // every edge but the pole edge, with the pickers
    for (const [a, b] of edges.filter(([a, b]) => !(a === 1 && b === 2))) {
      await user.selectOptions(screen.getByLabelText('Join node'), String(a));
      await user.selectOptions(screen.getByLabelText('to node'), String(b));
      await user.click(screen.getByRole('button', { name: 'Join' }));
    }
    expect(screen.getByRole('list', { name: 'Edges' }).querySelectorAll('li')).toHaveLength(7);
    await user.selectOptions(screen.getByLabelText('Top pole'), '1');
    await user.selectOptions(screen.getByLabelText('Bottom pole'), '2');
    await user.click(screen.getByRole('button', { name: 'Set the poles' }));
    // W4 with a rim pole edge: a 7 x 8 rectangle of 7 squares, 45 spanning trees (OEIS A004146)
    expect(await screen.findByRole('img', { name: 'Squared rectangle 7 by 8 of 7 squares' })).toBeTruthy();
    expect(screen.getByText('Edge 8: node 2 – node 3 (the pole edge)')).toBeTruthy();
    // one undo takes back the poles and their edge
    await user.click(screen.getByRole('button', { name: 'Undo' }));
    expect(screen.getByRole('list', { name: 'Edges' }).querySelectorAll('li')).toHaveLength(7);
    expect(screen.queryByRole('img', { name: /Squared rectangle/ })).toBeNull();
    // the poles again, on the canvas: tool, then Enter on node 2 and node 3
    await user.click(screen.getByLabelText('Choose poles'));
    fireEvent.keyDown(screen.getByRole('button', { name: /^Node 2\b/ }), { key: 'Enter' });
    fireEvent.keyDown(screen.getByRole('button', { name: /^Node 3\b/ }), { key: 'Enter' });
    expect(await screen.findByRole('img', { name: 'Squared rectangle 7 by 8 of 7 squares' })).toBeTruthy();
    expect(screen.getByRole('button', { name: /^Node 2, top pole/ })).toBeTruthy();
    await user.type(screen.getByLabelText('Title (optional)'), 'Wheel by keys');
    await user.type(screen.getByLabelText('Note to the editor (optional)'), 'Drawn without a mouse');
    await user.click(screen.getByRole('button', { name: 'Submit this tiling' }));
    await waitFor(() => expect(sent.length).toBe(1));
    expect(sent[0]).toMatchObject({ source: 'sketch', title: 'Wheel by keys', note: 'Drawn without a mouse', squares: { width: 7, height: 8 } });
  });
});
