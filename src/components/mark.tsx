/**
 * Squarewright's mark: the smallest perfect squared rectangle (33 x 32, order 9,
 * Bouwkamp code (18,15)(7,8)(14,4)(10,1)(9); Moroń 1925), drawn in our palette.
 * Decorative by default; pass `title` to make it an image with a name.
 */
export function SquarewrightMark({ size = 28, title }: { size?: number; title?: string }) {
  const squares: readonly [x: number, y: number, s: number, fill: string][] = [
    [0, 0, 18, 'var(--color-ink, #1f2328)'],
    [18, 0, 15, 'var(--color-surface, #fffdf9)'],
    [18, 15, 7, 'var(--color-accent, #b5522b)'],
    [25, 15, 8, 'var(--color-surface, #fffdf9)'],
    [0, 18, 14, 'var(--color-surface, #fffdf9)'],
    [14, 18, 4, 'var(--color-ink, #1f2328)'],
    [14, 22, 10, 'var(--color-accent-soft, #e9c9b6)'],
    [24, 22, 1, 'var(--color-ink, #1f2328)'],
    [24, 23, 9, 'var(--color-ink, #1f2328)'],
  ];
  return (
    <svg
      width={size}
      height={(size * 32) / 33}
      viewBox="-0.75 -0.75 34.5 33.5"
      role={title ? 'img' : undefined}
      aria-hidden={title ? undefined : true}
      aria-label={title}
      focusable="false"
    >
      {squares.map(([x, y, s, fill]) => (
        <rect key={`${x}-${y}`} x={x} y={y} width={s} height={s} fill={fill} stroke="var(--color-ink, #1f2328)" strokeWidth={1.1} />
      ))}
    </svg>
  );
}
