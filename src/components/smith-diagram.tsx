import { numberLabelProps, tilingPalette } from './tiling-palette';

export interface SmithDiagramNode { id: number; y: number; x0: number; x1: number }
export interface SmithDiagramEdge { square: number; from: number; to: number; x: number; current: number }
export interface SmithDiagramData {
  width: number;
  height: number;
  nodes: SmithDiagramNode[];
  edges: SmithDiagramEdge[];
  pole: { top: number; bottom: number };
}

export interface SmithDiagramProps {
  diagram: SmithDiagramData;
  title?: string;
  /** Show the currents on the edges (default true). */
  labels?: boolean;
  className?: string;
}

/**
 * The Smith diagram of a tiling: each node (a maximal horizontal segment) as a horizontal line
 * at its height over its x-range, each square as a vertical edge at the square's centre x
 * labelled with its current (its side), and the pole edge (the battery) as an arc round the
 * outside, from the top node to the bottom node (Brooks, Smith, Stone and Tutte 1940).
 */
export function SmithDiagram({ diagram, title, labels = true, className }: SmithDiagramProps) {
  const { width, height, nodes, edges, pole } = diagram;
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const unit = Math.max(width, height);
  const margin = unit * 0.14;
  const stroke = unit / 260;
  const fontSize = unit * 0.035;
  const top = byId.get(pole.top);
  const bottom = byId.get(pole.bottom);
  const label = title ?? `Smith diagram: ${nodes.length} nodes, ${edges.length} edges and the pole edge`;
  const arcX = width + margin * 0.75;
  return (
    <svg
      role="img"
      aria-label={label}
      viewBox={`${-margin * 0.3} ${-margin * 0.5} ${width + margin * 1.3} ${height + margin}`}
      className={className}
      style={{ width: '100%', height: 'auto', display: 'block' }}
      xmlns="http://www.w3.org/2000/svg"
    >
      <title>{label}</title>
      {top && bottom && (
        <path
          data-pole="true"
          d={`M ${top.x1} ${top.y} C ${arcX} ${top.y - margin * 0.4}, ${arcX} ${bottom.y + margin * 0.4}, ${bottom.x1} ${bottom.y}`}
          fill="none"
          stroke={tilingPalette.accent}
          strokeWidth={stroke * 1.5}
          strokeDasharray={`${stroke * 4} ${stroke * 3}`}
        />
      )}
      {edges.map((e) => {
        const a = byId.get(e.from);
        const b = byId.get(e.to);
        if (!a || !b) return null;
        const mid = (a.y + b.y) / 2;
        return (
          <g key={e.square} data-edge={e.square}>
            <line x1={e.x} y1={a.y} x2={e.x} y2={b.y} stroke={tilingPalette.ink} strokeWidth={stroke} />
            {labels && (
              <text
                x={e.x + stroke * 3}
                y={mid}
                fontSize={fontSize}
                dominantBaseline="central"
                {...numberLabelProps}
              >
                {e.current}
              </text>
            )}
          </g>
        );
      })}
      {nodes.map((n) => (
        <line
          key={n.id}
          data-node={n.id}
          x1={n.x0}
          y1={n.y}
          x2={n.x1}
          y2={n.y}
          stroke={tilingPalette.ink}
          strokeWidth={stroke * 3}
          strokeLinecap="round"
        />
      ))}
    </svg>
  );
}
