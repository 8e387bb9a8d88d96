import { TZDate } from '@date-fns/tz';
import type { EditionState } from '../../../shared/contracts/editions';
import type { SolutionRule } from '../../../shared/contracts/publications';

// THE release rule of published content (interfaces.md, 2026-12-04), pure: the reader's public
// pages and the integrations' feed both decide with it what a reader may see and when.
//
//  - an edition is public at `now` iff it is published AND `now` is at or after its release
//    moment: the edition date at the publication's release time, in the publication's time zone;
//  - its solutions are public iff the edition is public AND (the solution rule is same_edition,
//    OR a later edition (a greater number) of the same publication is itself public at `now`).
//
// Anything not public answers 404 exactly like an address that never existed.

/** What the rule reads of one edition. */
export type ReleaseEdition = { number: number; editionDate: string; state: EditionState };
/** What the rule reads of the publication. */
export type ReleaseSettings = { timeZone: string; releaseTime: string; solutionRule: SolutionRule };

export type Release = {
  /** the edition date at the release time in the publication's time zone */
  releasedAt: Date;
  public: boolean;
  solutionsPublic: boolean;
  /** when the solutions become public: known for same_edition, or once a later edition is published; else null */
  solutionsFrom: Date | null;
};

/**
 * The moment a wall-clock date and time happens in an IANA time zone. A time skipped by a
 * daylight-saving change (e.g. 01:30 on the spring-forward night in London) moves forward
 * by the gap, as the time-zone library resolves it.
 */
export function releaseMoment(editionDate: string, releaseTime: string, timeZone: string): Date {
  const d = /^(\d{4})-(\d{2})-(\d{2})$/.exec(editionDate);
  const t = /^(\d{2}):(\d{2})$/.exec(releaseTime);
  if (!d || !t) throw new Error(`release moment: expected YYYY-MM-DD and HH:MM, got ${editionDate} ${releaseTime}`);
  const at = new TZDate(Number(d[1]), Number(d[2]) - 1, Number(d[3]), Number(t[1]), Number(t[2]), 0, 0, timeZone);
  const ms = at.getTime();
  if (!Number.isFinite(ms)) throw new Error(`release moment: ${editionDate} ${releaseTime} in ${timeZone} is not a time`);
  return new Date(ms);
}

/** The release of every edition of one publication at `now`, keyed by edition number. */
export function releasesOf(editions: readonly ReleaseEdition[], settings: ReleaseSettings, now: Date): Map<number, Release> {
  const t = now.getTime();
  const moments = editions.map((e) => ({ e, at: releaseMoment(e.editionDate, settings.releaseTime, settings.timeZone) }));
  const out = new Map<number, Release>();
  for (const { e, at } of moments) {
    const isPublic = e.state === 'published' && t >= at.getTime();
    let solutionsFrom: Date | null;
    if (settings.solutionRule === 'same_edition') {
      solutionsFrom = e.state === 'published' ? at : null;
    } else {
      // the first moment a later published edition goes public (never before this one does)
      const later = moments.filter((m) => m.e.number > e.number && m.e.state === 'published').map((m) => m.at.getTime());
      solutionsFrom = e.state === 'published' && later.length > 0 ? new Date(Math.max(at.getTime(), Math.min(...later))) : null;
    }
    out.set(e.number, {
      releasedAt: at,
      public: isPublic,
      solutionsPublic: isPublic && solutionsFrom !== null && t >= solutionsFrom.getTime(),
      solutionsFrom,
    });
  }
  return out;
}
