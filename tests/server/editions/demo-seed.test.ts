import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { user } from '../../../server/platform/auth/schema';
import { saturdayOnOrAfter, saturdayOnOrBefore, seedDemoEditions } from '../../../server/areas/editions/demo-seed';
import { listEditions } from '../../../server/areas/editions/editions';
import { listPublications, seedDemoPublications } from '../../../server/areas/editions/publications';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { TILING_33x32, TILING_69x61 } from '../print/fixtures/sample-edition';
import { stubPuzzles } from '../print/fixtures/stub-puzzles';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ demo: true });
});
afterAll(() => t.close());

const admin = { id: 'x', email: 'a@x', name: 'A', role: 'admin' as const };

describe('print demo data', () => {
  it('seeds the two Larkspur & Quill publications', () => {
    seedDemoPublications(t.deps);
    seedDemoPublications(t.deps); // a second run adds nothing
    expect(listPublications(t.db).map((p) => `${p.title}|${p.cadence}|${p.templateId}`)).toEqual([
      'Squared Away Monthly|monthly|a4',
      'The Saturday Quadrant|weekly|newspaper-column',
    ]);
  });

  it('drives a published edition and one in proof when puzzles are printable', async () => {
    const setter = t.db.select({ id: user.id }).from(user).where(eq(user.email, 'setter@demo.squarewright.test')).get()!;
    const puzzles = stubPuzzles(t.deps);
    for (const [i, tiling] of [TILING_33x32, TILING_69x61, TILING_33x32, TILING_69x61].entries()) {
      // each its own tiling key, so No. 40 and No. 41 pass the reuse guard
      const p = puzzles.add({ tiling, kind: 'assembly', setterId: setter.id });
      puzzles.replace({ ...p, title: `Demo ${i}`, grade: 1, tilingKey: `k${i}`, assembly: { frame: { W: tiling.W, H: tiling.H }, pieces: tiling.squares.map((q) => q.s), starters: [] } });
    }
    t.deps.puzzles = puzzles;
    await seedDemoEditions(t.deps);
    const list = listEditions(t.deps, admin, {});
    expect(list.map((e) => `${e.publicationTitle} ${e.number} ${e.state}`).sort()).toEqual([
      'Squared Away Monthly 12 draft',
      'The Saturday Quadrant 40 published',
      'The Saturday Quadrant 41 in_proof',
      'The Saturday Quadrant 42 draft',
    ]);
    const n41 = list.find((e) => e.number === 41)!;
    expect(n41.latestProofVersion).toBe(1);
    // editions of a weekly column fall a week apart, on Saturdays (getUTCDay() 6)
    expect(new Date(`${n41.date}T00:00:00Z`).getUTCDay()).toBe(6);
    expect(saturdayOnOrAfter(new Date('2026-12-02T10:00:00Z')).toISOString().slice(0, 10)).toBe('2026-12-05');
    // No. 41 is this week's: dated on or before today, so once approved it may be published (issue 16's date guard)
    expect(n41.date <= t.clock.now().toISOString().slice(0, 10)).toBe(true);
    // 2026-12-02 was a Wednesday, 2026-11-28 the Saturday before it (calendar); a Saturday is its own
    expect(saturdayOnOrBefore(new Date('2026-12-02T10:00:00Z')).toISOString().slice(0, 10)).toBe('2026-11-28');
    expect(saturdayOnOrBefore(new Date('2026-12-05T23:00:00Z')).toISOString().slice(0, 10)).toBe('2026-12-05');
  });
});
