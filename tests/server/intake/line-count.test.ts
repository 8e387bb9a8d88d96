import { describe, expect, it } from 'vitest';
import { lineCount } from '../../../server/areas/intake/uploads';
import { mulberry32 } from '../../../shared/tiling/prng';

// The upload's line count scans the bytes (no text built on the request thread); it must count
// as splitting the decoded text at \r\n, \r or \n does (the straightforward way, used before).
function bySplit(text: string): number {
  const lines = text.split(/\r\n|\r|\n/);
  return lines.length > 0 && lines[lines.length - 1] === '' ? lines.length - 1 : lines.length;
}

describe('upload line count from the bytes', () => {
  it('agrees with splitting the text on 2,000 random files of codes, CR, LF and CRLF', () => {
    const rnd = mulberry32(51);
    const pieces = ['\n', '\r', '\r\n', '\n\r', '(12,3)', ' 7 ', '', 'é', '\r\r'];
    for (let k = 0; k < 2000; k++) {
      let text = '';
      const n = Math.floor(rnd() * 12);
      for (let i = 0; i < n; i++) text += pieces[Math.floor(rnd() * pieces.length)]!;
      expect(lineCount(Buffer.from(text, 'utf8')), JSON.stringify(text)).toBe(bySplit(text));
    }
  });
  it('counts the usual cases', () => {
    expect(lineCount(Buffer.from(''))).toBe(0);
    expect(lineCount(Buffer.from('a'))).toBe(1);
    expect(lineCount(Buffer.from('a\r\nb\r\n'))).toBe(2);
    expect(lineCount(Buffer.from('a\rb\nc'))).toBe(3);
  });
});
