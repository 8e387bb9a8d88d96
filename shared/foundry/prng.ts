// mulberry32: the seeded PRNG of the tiling engine (one implementation for all engines).
export { mulberry32 } from '../tiling/index';

/** Integer in [0, n). */
export function randomInt(rnd: () => number, n: number): number {
  return Math.floor(rnd() * n);
}
