import type { StockSummary } from '../../../../shared/contracts/stock';
import { tilingPalette } from '../../../components/tiling-palette';

/** Bars of the stock by order (and by grade once puzzles exist), drawn as SVG with a table fallback for screen readers. */
export function StockChart({ summary }: { summary: StockSummary }) {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <Bars title="Tilings by order" unit="order" data={summary.byOrder.map((b) => ({ label: String(b.order), count: b.count }))} />
      {summary.byGrade.length ? <Bars title="Puzzles by grade" unit="grade" data={summary.byGrade.map((b) => ({ label: String(b.grade), count: b.count }))} /> : null}
    </div>
  );
}

function Bars({ title, unit, data }: { title: string; unit: string; data: { label: string; count: number }[] }) {
  const W = 360;
  const H = 140;
  const pad = 22;
  const max = Math.max(1, ...data.map((d) => d.count));
  const bw = data.length ? (W - pad) / data.length : 0;
  return (
    <figure className="flex flex-col gap-1">
      <figcaption className="text-sm font-semibold">{title}</figcaption>
      <svg role="img" aria-label={`${title}: ${data.map((d) => `${unit} ${d.label}: ${d.count}`).join(', ')}`} viewBox={`0 0 ${W} ${H + pad}`} className="w-full max-w-lg">
        <line x1={pad} y1={H} x2={W} y2={H} stroke={tilingPalette.muted} />
        {data.map((d, i) => {
          const h = (d.count / max) * (H - 16);
          const x = pad + i * bw + bw * 0.15;
          return (
            <g key={d.label}>
              <rect x={x} y={H - h} width={bw * 0.7} height={h} fill={tilingPalette.accent} opacity={0.8} />
              <text x={x + bw * 0.35} y={H - h - 3} fontSize={10} textAnchor="middle">{d.count}</text>
              <text x={x + bw * 0.35} y={H + 14} fontSize={10} textAnchor="middle">{d.label}</text>
            </g>
          );
        })}
      </svg>
    </figure>
  );
}
