/**
 * Squarewright's mark: the smallest perfect squared rectangle (33 x 32, order 9,
 * Bouwkamp code (18,15)(7,8)(14,4)(10,1)(9); Moroń 1925), drawn in our palette.
 * Decorative by default; pass `title` to make it an image with a name.
 */
export function SquarewrightMark({ size = 28, title }: { size?: number; title?: string }) {
  const ink = 'var(--color-ink, #1f2328)';
  const paper = 'var(--color-surface, #fffdf9)';
  const squares: readonly [x: number, y: number, s: number, fill: string][] = [
    [0, 0, 18, 'var(--color-accent, #b5522b)'],
    [18, 0, 15, paper],
    [18, 15, 7, 'var(--color-accent-soft, #e9c9b6)'],
    [25, 15, 8, paper],
    [0, 18, 14, paper],
    [14, 18, 4, ink],
    [14, 22, 10, 'var(--color-paper-deep, #efeae0)'],
    [24, 22, 1, ink],
    [24, 23, 9, ink],
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
        <rect key={`${x}-${y}`} x={x} y={y} width={s} height={s} fill={fill} stroke={ink} strokeWidth={1.2} strokeLinejoin="miter" />
      ))}
    </svg>
  );
}
