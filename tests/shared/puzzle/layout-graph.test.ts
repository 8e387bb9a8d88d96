import { describe, expect, it } from 'vitest';
import { parseTiling, smithDiagram } from '../../../shared/tiling/index';
import type { Tiling } from '../../../shared/tiling/index';
import { layoutGraph, tilingLayout } from '../../../shared/puzzle/layout-graph';
import type { LayoutSegment } from '../../../shared/puzzle/layout-graph';
import { catalogue } from './catalogue';

// the two Smith diagrams of the tiling engine (BSST 1940) are the outside reference here
function agreesWithSmithDiagrams(t: Tiling): void {
  const g = tilingLayout(t);
  for (const direction of ['horizontal', 'vertical'] as const) {
    const d = smithDiagram(t, direction);
    const mine: LayoutSegment[] = direction === 'horizontal' ? g.horizontal : g.vertical;
    expect(mine.length).toBe(d.nodes.length);
    const id = new Map(d.nodes.map((nd) => [`${nd.at}:${nd.start}:${nd.end}`, nd.id]));
    const map = mine.map((sg) => id.get(`${sg.at}:${sg.start}:${sg.end}`));
    expect(map.every((v) => v !== undefined)).toBe(true);
    for (const e of d.edges) {
      const c = g.cells[e.square]!;
      const [a, b] = direction === 'horizontal' ? [c.top, c.bottom] : [c.left, c.right];
      expect([map[a], map[b]]).toEqual([e.from, e.to]);
    }
  }
}

describe('layout graph', () => {
  it('matches both Smith diagrams of the tiling engine on every catalogue rectangle of orders 9 to 11', () => {
    for (const order of [9, 10, 11]) for (const { tiling } of catalogue(order)) agreesWithSmithDiagrams(tiling);
  });

  it('joins touching collinear pieces at a cross into one segment (engine.md 4)', () => {
    // four unit squares meeting at the centre of a 2 x 2 frame: one horizontal middle line
    const t: Tiling = { W: 2, H: 2, squares: [{ x: 0, y: 0, s: 1 }, { x: 1, y: 0, s: 1 }, { x: 0, y: 1, s: 1 }, { x: 1, y: 1, s: 1 }] };
    const g = tilingLayout(t);
    expect(g.horizontal).toEqual([{ at: 0, start: 0, end: 2 }, { at: 1, start: 0, end: 2 }, { at: 2, start: 0, end: 2 }]);
    expect(g.vertical.length).toBe(3);
    agreesWithSmithDiagrams(t);
  });

  it('puts the frame sides first and last', () => {
    const t = parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)');
    const g = tilingLayout(t);
    expect(g.horizontal[0]).toEqual({ at: 0, start: 0, end: 33 });
    expect(g.horizontal[g.horizontal.length - 1]).toEqual({ at: 32, start: 0, end: 33 });
    expect(g.vertical[0]).toEqual({ at: 0, start: 0, end: 32 });
    expect(g.vertical[g.vertical.length - 1]).toEqual({ at: 33, start: 0, end: 32 });
  });

  it('works on rectangles as well as squares', () => {
    const g = layoutGraph(3, 2, [{ x: 0, y: 0, w: 1, h: 2 }, { x: 1, y: 0, w: 2, h: 1 }, { x: 1, y: 1, w: 2, h: 1 }]);
    expect(g.cells).toEqual([
      { top: 0, bottom: 2, left: 0, right: 1 },
      { top: 0, bottom: 1, left: 1, right: 2 },
      { top: 1, bottom: 2, left: 1, right: 2 },
    ]);
  });
});
