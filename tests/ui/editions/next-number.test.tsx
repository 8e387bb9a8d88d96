import { describe, expect, it } from 'vitest';
import { nextEditionNumber } from '../../../src/features/editions/components/editions-page';

// Issue 16 item 8: a new edition's number defaults to the next one of its publication, not 1
// (the browser flow is in tests/e2e/guard-rails.e2e.test.ts).
describe('the number a new edition takes by default', () => {
  it('is one after the highest of the publication, whatever the order or gaps', () => {
    expect(nextEditionNumber([{ number: 40 }, { number: 42 }, { number: 39 }, { number: 41 }])).toBe(43);
    expect(nextEditionNumber([{ number: 12 }])).toBe(13);
    expect(nextEditionNumber([{ number: 1 }, { number: 90 }])).toBe(91);
  });

  it('is 1 for a publication with no edition yet', () => {
    expect(nextEditionNumber([])).toBe(1);
  });
});
