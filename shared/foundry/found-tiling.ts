import { canonicalCode, canonicalKey, classifyTiling, verifyTiling, type Classification, type Tiling } from '../tiling/index';

/** A tiling the foundry made, verified and classified. */
export interface FoundTiling {
  /** stock key, e.g. "33x32:18,15,7,8,14,4,10,1,9" */
  key: string;
  /** canonical Bouwkamp code with header */
  code: string;
  order: number;
  /** canonical orientation: width >= height */
  width: number;
  height: number;
  perfect: boolean;
  simple: boolean;
  square: boolean;
  maxSize: number;
  tiling: Tiling;
  /** how it was made (JSON) */
  origin: Record<string, unknown>;
}

/** What every foundry run (exhaustive, random, joining) takes besides its own options. */
export interface FoundryRunControl {
  /** polled during the run; true ends it early (the summary then says stopped) */
  shouldStop?: () => boolean;
  /** called once per tiling the run offers, as soon as it is found */
  onFound?: (t: FoundTiling) => void;
}

/** Re-verify (exact cover) and classify; null when the tiling does not verify. */
export function describeTiling(t: Tiling, origin: Record<string, unknown>, cls?: Classification): FoundTiling | null {
  if (!verifyTiling(t).ok) return null;
  const c = cls ?? classifyTiling(t);
  return {
    key: canonicalKey(t),
    code: canonicalCode(t),
    order: c.order,
    width: Math.max(c.width, c.height),
    height: Math.min(c.width, c.height),
    perfect: c.perfect,
    simple: c.simple,
    square: c.square,
    maxSize: c.maxSize,
    tiling: t,
    origin,
  };
}
