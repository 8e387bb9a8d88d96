import { TilingInputError, type Classification, type Tiling } from '../tiling/index';
import { tilingFacts, type TilingFacts } from '../tiling/tiling-facts';

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

/** The verified facts of t (one decode: verification, classification, canonical code), or null when t is not a tiling. */
export function factsOf(t: Tiling): TilingFacts | null {
  try {
    return tilingFacts(t);
  } catch (e) {
    if (e instanceof TilingInputError) return null;
    throw e;
  }
}

/** A found tiling from its facts. */
export function foundTiling(f: TilingFacts, origin: Record<string, unknown>): FoundTiling {
  const c: Classification = f.classification;
  return {
    key: f.key,
    code: f.code,
    order: c.order,
    width: Math.max(c.width, c.height),
    height: Math.min(c.width, c.height),
    perfect: c.perfect,
    simple: c.simple,
    square: c.square,
    maxSize: c.maxSize,
    tiling: f.tiling,
    origin,
  };
}

/** Re-verify (exact cover) and classify; null when the tiling does not verify. */
export function describeTiling(t: Tiling, origin: Record<string, unknown>): FoundTiling | null {
  const f = factsOf(t);
  return f ? foundTiling(f, origin) : null;
}
