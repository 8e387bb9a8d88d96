// mulberry32: the seeded PRNG of the tiling engine (one implementation for all engines);
// floats in [0, 1), same seed, same sequence.
export { mulberry32 } from '../tiling/index';

/** Fisher-Yates shuffle of a copy, driven by the given PRNG. */
export function shuffled<T>(items: readonly T[], random: () => number): T[] {
  const a = items.slice();
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    const t = a[i]!;
    a[i] = a[j]!;
    a[j] = t;
  }
  return a;
}
