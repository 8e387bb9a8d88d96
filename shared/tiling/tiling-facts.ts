// What accepting a tiling takes, at the cost of one decode: the tiling, its classification
// (with the sub-rectangles) and its canonical code and key (and the canonical orientation when
// asked). acceptCode reads a code (parse.ts's formats and messages); tilingFacts takes a
// tiling given by its squares.
import { parseTiling } from './parse';
import { readFast } from './read-fast';
import { core } from './tiling-core';
import { TilingInputError } from './errors';
import { verifyTiling } from './verify';
import type { Classification, Tiling } from './types';

export interface TilingFacts {
  /** the tiling as read (squares in reading order for a code) */
  tiling: Tiling;
  classification: Classification;
  /** canonical Bouwkamp code with header */
  code: string;
  /** stock key, "WxH:" + the canonical sizes */
  key: string;
  /** the canonical orientation, when asked for */
  canonicalTiling: Tiling | null;
}

function factsOfCore(tiling: Tiling, withCanonicalTiling: boolean): TilingFacts {
  const classification = core.classify();
  const c = core.canonical(withCanonicalTiling);
  return { tiling, classification, code: c.code, key: c.key, canonicalTiling: c.tiling };
}

/** Reads, decodes and verifies a code, classifies it and gives its canonical code; throws TilingInputError like parseTiling. */
export function acceptCode(text: string, withCanonicalTiling = false): TilingFacts {
  if (typeof text === 'string' && readFast(text)) return factsOfCore(core.tiling(), withCanonicalTiling);
  return tilingFacts(parseTiling(text), withCanonicalTiling);
}

/** The facts of a tiling given by its squares; throws TilingInputError when it is not a tiling. */
export function tilingFacts(t: Tiling, withCanonicalTiling = false): TilingFacts {
  if (!core.load(t)) {
    const v = verifyTiling(t);
    throw new TilingInputError('invalid-tiling', v.ok ? 'the squares do not tile the rectangle' : v.message, v.ok || v.square === undefined ? undefined : { square: v.square + 1 });
  }
  return factsOfCore(t, withCanonicalTiling);
}
