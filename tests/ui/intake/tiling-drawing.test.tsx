import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { TilingDrawing } from '../../../src/components/tiling-drawing';
import { order9Tiling } from '../../fixtures/order9';

describe('TilingDrawing', () => {
  it('draws one square per square of the published 33 x 32 rectangle with its size written in it', () => {
    const { container } = render(<TilingDrawing tiling={order9Tiling} />);
    const img = screen.getByRole('img', { name: 'Squared rectangle 33 by 32 of 9 squares' });
    expect(img.getAttribute('viewBox')).toContain('33');
    const squares = container.querySelectorAll('g[data-square] rect');
    expect(squares).toHaveLength(9);
    // the drawn rectangles cover the frame exactly: sum of areas = W x H (33 * 32 = 1056)
    let area = 0;
    for (const r of squares) area += Number(r.getAttribute('width')) * Number(r.getAttribute('height'));
    expect(area).toBe(33 * 32);
    const labels = [...container.querySelectorAll('text')].map((t) => t.textContent);
    expect(labels).toEqual(['18', '15', '7', '8', '14', '4', '10', '1', '9']);
  });

  it('scales each label to its square so a 1 never spills out of a 1 x 1 square', () => {
    const { container } = render(<TilingDrawing tiling={order9Tiling} />);
    for (const g of container.querySelectorAll('g[data-square]')) {
      const side = Number(g.querySelector('rect')?.getAttribute('width'));
      const text = g.querySelector('text');
      const fs = Number(text?.getAttribute('font-size'));
      expect(fs).toBeGreaterThan(0);
      expect(fs * 0.62 * String(text?.textContent).length).toBeLessThanOrEqual(side);
    }
  });

  it('highlights the chosen squares and only those', () => {
    const { container } = render(<TilingDrawing tiling={order9Tiling} highlight={[2, 7]} title="with marks" />);
    screen.getByRole('img', { name: 'with marks' });
    const marked = [...container.querySelectorAll('g[data-highlight="true"]')].map((g) => g.getAttribute('data-square'));
    expect(marked).toEqual(['2', '7']);
  });

  it('leaves out labels too small to read at thumbnail size', () => {
    const { container } = render(<TilingDrawing tiling={order9Tiling} pixelWidth={40} />);
    const labels = [...container.querySelectorAll('text')].map((t) => t.textContent);
    // at 40 px for 33 units a label of the 18 square is 18*0.5*40/33 ~ 10.9 px: kept; the 1 is 0.6 px: dropped
    expect(labels).toContain('18');
    expect(labels).not.toContain('1');
  });
});
