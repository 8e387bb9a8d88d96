import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { sha256Hex } from '../../../shared/puzzle/sha256';
import { mulberry32 } from '../../../shared/tiling/index';

describe('sha256', () => {
  it('gives the FIPS 180-2 example digests ("abc", the 448-bit message) and the empty-string digest', () => {
    // FIPS 180-2, appendix B.1 and B.2
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
    // NIST test vector for the empty message
    expect(sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });

  it("agrees with node's crypto on seeded texts of every length up to 200, including non-ASCII", () => {
    const rnd = mulberry32(99);
    const alphabet = 'abcXYZ019 ,:{}"é€😀';
    for (let len = 0; len <= 200; len++) {
      let s = '';
      for (let i = 0; i < len; i++) s += [...alphabet][Math.floor(rnd() * [...alphabet].length)]!;
      expect(sha256Hex(s)).toBe(createHash('sha256').update(s, 'utf8').digest('hex'));
    }
  });
});
