import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { SmithDiagram, type SmithDiagramData } from '../../../src/components/smith-diagram';

// The Smith diagram of the published 33 x 32 rectangle (facts.md: segments at y = 0, 15, 18, 22, 23, 32),
// written out by hand from its placement.
const diagram: SmithDiagramData = {
  width: 33,
  height: 32,
  nodes: [
    { id: 0, y: 0, x0: 0, x1: 33 },
    { id: 1, y: 15, x0: 18, x1: 33 },
    { id: 2, y: 18, x0: 0, x1: 18 },
    { id: 3, y: 22, x0: 14, x1: 25 },
    { id: 4, y: 23, x0: 24, x1: 33 },
    { id: 5, y: 32, x0: 0, x1: 33 },
  ],
  edges: [
    { square: 0, from: 0, to: 2, x: 9, current: 18 },
    { square: 1, from: 0, to: 1, x: 25.5, current: 15 },
    { square: 2, from: 1, to: 3, x: 21.5, current: 7 },
    { square: 3, from: 1, to: 4, x: 29, current: 8 },
    { square: 4, from: 2, to: 5, x: 7, current: 14 },
    { square: 5, from: 2, to: 3, x: 16, current: 4 },
    { square: 6, from: 3, to: 5, x: 19, current: 10 },
    { square: 7, from: 3, to: 4, x: 24.5, current: 1 },
    { square: 8, from: 4, to: 5, x: 28.5, current: 9 },
  ],
  pole: { top: 0, bottom: 5 },
};

describe('SmithDiagram', () => {
  it('draws each node as a horizontal line at its height over its x-range', () => {
    const { container } = render(<SmithDiagram diagram={diagram} />);
    screen.getByRole('img', { name: /Smith diagram: 6 nodes, 9 edges/ });
    const nodes = [...container.querySelectorAll('line[data-node]')];
    expect(nodes).toHaveLength(6);
    for (const n of nodes) expect(n.getAttribute('y1')).toBe(n.getAttribute('y2'));
    expect(nodes.map((n) => Number(n.getAttribute('y1')))).toEqual([0, 15, 18, 22, 23, 32]);
  });

  it('draws each square as a vertical edge between its nodes, labelled with its current', () => {
    const { container } = render(<SmithDiagram diagram={diagram} />);
    const edges = [...container.querySelectorAll('g[data-edge]')];
    expect(edges).toHaveLength(9);
    const first = edges[0]?.querySelector('line');
    expect(first?.getAttribute('x1')).toBe(first?.getAttribute('x2'));
    expect([first?.getAttribute('y1'), first?.getAttribute('y2')]).toEqual(['0', '18']);
    expect(edges.map((e) => e.querySelector('text')?.textContent)).toEqual(['18', '15', '7', '8', '14', '4', '10', '1', '9']);
    // Kirchhoff's current law on the drawn labels: what flows into node 3 from above (7 + 4) leaves below (10 + 1)
    const current = (sq: number) => diagram.edges[sq]?.current ?? NaN;
    expect(current(2) + current(5)).toBe(current(6) + current(7));
  });

  it('draws the pole edge as an arc from the top node to the bottom node outside the frame', () => {
    const { container } = render(<SmithDiagram diagram={diagram} labels={false} />);
    const pole = container.querySelector('path[data-pole]');
    expect(pole?.getAttribute('d')).toMatch(/^M 33 0 C [\d.]+ /);
    expect(pole?.getAttribute('d')).toMatch(/33 32$/);
    expect(container.querySelectorAll('text')).toHaveLength(0);
  });
});
