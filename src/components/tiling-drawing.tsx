import { fillForSize, numberLabelProps, tilingPalette } from './tiling-palette';

export interface TilingDrawingSquare { x: number; y: number; s: number }
export interface TilingDrawingTiling { W: number; H: number; squares: TilingDrawingSquare[] }

export interface TilingDrawingProps {
  tiling: TilingDrawingTiling;
  /** Indices of squares to highlight (e.g. the squares of a sub-rectangle, a duplicate's difference). */
  highlight?: readonly number[];
  /** Accessible title; a description of size and order by default. */
  title?: string;
  /** Show size labels (default true); labels too small to read are left out anyway. */
  labels?: boolean;
  /** The width the drawing is shown at, in CSS pixels; decides which labels are legible. */
  pixelWidth?: number;
  className?: string;
}

/** Smallest label height we draw, in CSS pixels (common practice for legible UI text). */
const MIN_LABEL_PX = 7;

/** An SVG drawing of a squared rectangle: each square with its size written in it, scaled to the square. */
export function TilingDrawing({ tiling, highlight, title, labels = true, pixelWidth, className }: TilingDrawingProps) {
  const { W, H, squares } = tiling;
  const marked = new Set(highlight ?? []);
  const label = title ?? `Squared rectangle ${W} by ${H} of ${squares.length} squares`;
  const stroke = Math.max(W, H) / 400;
  const scale = pixelWidth ? pixelWidth / W : Infinity;
  return (
    <svg
      role="img"
      aria-label={label}
      viewBox={`${-stroke} ${-stroke} ${W + 2 * stroke} ${H + 2 * stroke}`}
      className={className}
      style={{ width: pixelWidth ? `${pixelWidth}px` : '100%', height: 'auto', display: 'block' }}
      xmlns="http://www.w3.org/2000/svg"
    >
      <title>{label}</title>
      <rect x={0} y={0} width={W} height={H} fill={tilingPalette.paper} />
      {squares.map((q, i) => {
        const on = marked.has(i);
        // A label's height is a fraction of the square, shorter for long numbers so it never spills.
        const digits = String(q.s).length;
        const fontSize = Math.min(q.s * 0.5, (q.s * 0.85) / Math.max(1, digits * 0.62));
        const legible = labels && fontSize * scale >= MIN_LABEL_PX;
        return (
          <g key={i} data-square={i} data-highlight={on ? 'true' : undefined}>
            <rect
              x={q.x}
              y={q.y}
              width={q.s}
              height={q.s}
              fill={on ? tilingPalette.accentFill : fillForSize(q.s)}
              stroke={on ? tilingPalette.accent : tilingPalette.ink}
              strokeWidth={on ? stroke * 2.5 : stroke}
            />
            {legible && (
              <text
                x={q.x + q.s / 2}
                y={q.y + q.s / 2}
                fontSize={fontSize}
                textAnchor="middle"
                dominantBaseline="central"
                {...numberLabelProps}
              >
                {q.s}
              </text>
            )}
          </g>
        );
      })}
    </svg>
  );
}
