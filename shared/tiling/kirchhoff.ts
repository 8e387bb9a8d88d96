// Kirchhoff's laws on both Smith diagrams of a tiling (Brooks, Smith, Stone & Tutte 1940).
// Current law: at every node the currents in and out balance, except the poles, where the
// positive pole emits and the negative pole absorbs the full width (or height). Voltage law:
// a potential exists with potential(from) - potential(to) = current on every edge (unit
// resistance, Ohm's law), found by a walk from the positive pole and checked on every edge;
// the pole potential difference must be the full height (or width).

import { smithDiagram } from './smith-diagram';
import type { Direction, KirchhoffViolation, Tiling } from './types';

function checkOne(t: Tiling, direction: Direction, out: KirchhoffViolation[]): void {
  const d = smithDiagram(t, direction);
  const n = d.nodes.length;
  const across = direction === 'horizontal' ? t.W : t.H;
  const drop = direction === 'horizontal' ? t.H : t.W;
  const side = direction === 'horizontal' ? ['top', 'bottom'] : ['left', 'right'];
  const where = (v: number) => {
    const node = d.nodes[v]!;
    return direction === 'horizontal' ? `the horizontal segment at y=${node.at} (x ${node.start}..${node.end})` : `the vertical segment at x=${node.at} (y ${node.start}..${node.end})`;
  };
  if (d.pole.from < 0 || d.pole.to < 0) {
    out.push({ law: 'current', direction, message: `the ${direction} network has no ${d.pole.from < 0 ? side[0] : side[1]} pole: no square touches that side` });
    return;
  }
  const net: number[] = Array.from({ length: n }, () => 0);
  for (const e of d.edges) {
    net[e.from]! -= e.current;
    net[e.to]! += e.current;
  }
  for (let v = 0; v < n; v++) {
    const expected = v === d.pole.from ? -across : v === d.pole.to ? across : 0;
    if (net[v] !== expected) {
      const inflow = d.edges.filter((e) => e.to === v).reduce((a, e) => a + e.current, 0);
      const outflow = d.edges.filter((e) => e.from === v).reduce((a, e) => a + e.current, 0);
      const want = v === d.pole.from ? `it should emit ${across}` : v === d.pole.to ? `it should absorb ${across}` : 'they should balance';
      out.push({ law: 'current', direction, node: v, message: `current law fails at ${where(v)}: ${inflow} flows in and ${outflow} flows out; ${want}` });
    }
  }
  const pot: (number | undefined)[] = Array.from({ length: n }, () => undefined);
  const incident: number[][] = Array.from({ length: n }, () => []);
  d.edges.forEach((e, i) => {
    incident[e.from]!.push(i);
    incident[e.to]!.push(i);
  });
  pot[d.pole.from] = drop;
  const queue = [d.pole.from];
  for (let qi = 0; qi < queue.length; qi++) {
    const v = queue[qi]!;
    for (const i of incident[v]!) {
      const e = d.edges[i]!;
      const u = e.from === v ? e.to : e.from;
      const want = e.from === v ? pot[v]! - e.current : pot[v]! + e.current;
      const have = pot[u];
      if (have === undefined) {
        pot[u] = want;
        queue.push(u);
      }
    }
  }
  d.edges.forEach((e, i) => {
    const a = pot[e.from];
    const b = pot[e.to];
    if (a === undefined || b === undefined) {
      out.push({ law: 'voltage', direction, square: i, message: `square ${i + 1} (size ${e.current}) is not connected to the ${side[0]} pole in the ${direction} network` });
    } else if (a - b !== e.current) {
      out.push({ law: 'voltage', direction, square: i, message: `voltage law fails at square ${i + 1} (size ${e.current}): the potential drops by ${a - b} across it, not by its current ${e.current}` });
    }
  });
  const bottom = pot[d.pole.to];
  if (bottom !== undefined && bottom !== 0) {
    out.push({ law: 'voltage', direction, node: d.pole.to, message: `voltage law fails between the poles: the ${side[1]} side sits at potential ${bottom}, expected 0 with the ${side[0]} side at ${drop}` });
  }
}

export function checkKirchhoff(t: Tiling): { ok: boolean; violations: KirchhoffViolation[] } {
  if (t === null || typeof t !== 'object' || !Array.isArray(t.squares)) {
    return { ok: false, violations: [{ law: 'current', message: 'not a tiling: expected { W, H, squares: [] }' }] };
  }
  if (!Number.isInteger(t.W) || !Number.isInteger(t.H) || t.W <= 0 || t.H <= 0) {
    return { ok: false, violations: [{ law: 'current', message: `not a tiling: width and height must be positive integers (got ${String(t.W)} x ${String(t.H)})` }] };
  }
  for (let i = 0; i < t.squares.length; i++) {
    const q = t.squares[i];
    if (!q || !Number.isInteger(q.x) || !Number.isInteger(q.y) || !Number.isInteger(q.s) || q.s <= 0 || Math.abs(q.x) > 2 ** 31 || Math.abs(q.y) > 2 ** 31 || q.s > 2 ** 31) {
      return { ok: false, violations: [{ law: 'current', square: i, message: `not a tiling: square ${i + 1} needs integer x, y and a positive integer size up to 2^31` }] };
    }
  }
  const violations: KirchhoffViolation[] = [];
  checkOne(t, 'horizontal', violations);
  checkOne(t, 'vertical', violations);
  return { ok: violations.length === 0, violations };
}
