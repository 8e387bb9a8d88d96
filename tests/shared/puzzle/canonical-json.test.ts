import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../../../shared/puzzle/canonical-json';

describe('canonical JSON', () => {
  it('sorts keys at every depth and drops undefined fields, so equal data gives equal text', () => {
    expect(canonicalJson({ b: 1, a: [{ d: 2, c: 'x' }], e: undefined })).toBe('{"a":[{"c":"x","d":2}],"b":1}');
    expect(canonicalJson({ x: 1, y: 2 })).toBe(canonicalJson({ y: 2, x: 1 }));
  });
  it('is parsed back by JSON.parse to the same data', () => {
    const v = { kind: 'assembly', pieces: [3, 2, 1], starters: [{ size: 2, x: 0, y: 1 }], ok: true, none: null };
    expect(JSON.parse(canonicalJson(v))).toEqual(v);
  });
  it('refuses values without a JSON form', () => {
    expect(() => canonicalJson({ level: Number.POSITIVE_INFINITY })).toThrow(/no JSON form/);
    expect(() => canonicalJson({ f: () => 1 })).toThrow(/no JSON form/);
  });
});
