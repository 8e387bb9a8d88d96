import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../../shared/puzzle/index';
import { releaseMoment, releasesOf, type ReleaseEdition, type ReleaseSettings } from '../../../server/areas/reader/release';

// THE release rule of published content (interfaces.md, 2026-12-04): an edition is public from
// its date at the publication's release time in the publication's time zone, once published;
// its solutions with it (same_edition) or once a later edition is public (next_edition).

/** The wall clock an instant shows in a zone, read by the runtime's ICU time-zone data (an outside reference). */
function wallClock(at: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(at);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? '';
  return `${get('year')}-${get('month')}-${get('day')} ${get('hour')}:${get('minute')}`;
}

describe('the release moment', () => {
  it('reads the date and time in the publication time zone, summer and winter', () => {
    // IANA tz database (from memory): London is UTC+0 in winter and UTC+1 (BST) in summer;
    // New York UTC-5 (EST) / UTC-4 (EDT); Kolkata UTC+5:30 all year
    expect(releaseMoment('2026-01-10', '06:00', 'Europe/London').toISOString()).toBe('2026-01-10T06:00:00.000Z');
    expect(releaseMoment('2026-07-04', '06:00', 'Europe/London').toISOString()).toBe('2026-07-04T05:00:00.000Z');
    expect(releaseMoment('2026-01-10', '00:00', 'America/New_York').toISOString()).toBe('2026-01-10T05:00:00.000Z');
    expect(releaseMoment('2026-07-04', '00:00', 'America/New_York').toISOString()).toBe('2026-07-04T04:00:00.000Z');
    expect(releaseMoment('2026-03-01', '09:30', 'Asia/Kolkata').toISOString()).toBe('2026-03-01T04:00:00.000Z');
    expect(releaseMoment('2026-03-01', '09:30', 'UTC').toISOString()).toBe('2026-03-01T09:30:00.000Z');
  });

  it('moves a time the clocks skip forward by the gap (London, 29 March 2026, 01:00 -> 02:00)', () => {
    // EU summer time starts on the last Sunday of March at 01:00 UTC (from memory): 01:30 does not exist in London that night
    expect(releaseMoment('2026-03-29', '01:30', 'Europe/London').toISOString()).toBe('2026-03-29T01:30:00.000Z');
    expect(wallClock(releaseMoment('2026-03-29', '01:30', 'Europe/London'), 'Europe/London')).toBe('2026-03-29 02:30');
  });

  it('shows the same wall clock in its zone as Intl reads it back, across seeded dates and zones', () => {
    const zones = ['Europe/London', 'America/New_York', 'Australia/Sydney', 'Asia/Tokyo', 'Pacific/Auckland', 'America/Sao_Paulo', 'UTC'];
    const rand = mulberry32(7);
    for (let i = 0; i < 400; i++) {
      const zone = zones[Math.floor(rand() * zones.length)]!;
      const day = new Date(Date.UTC(2024, 0, 1) + Math.floor(rand() * 1500) * 86_400_000).toISOString().slice(0, 10);
      // whole hours away from the 01:00-03:00 change-over window so every time exists
      const time = `${String(4 + Math.floor(rand() * 20)).padStart(2, '0')}:${String(Math.floor(rand() * 60)).padStart(2, '0')}`;
      expect(wallClock(releaseMoment(day, time, zone), zone), `${day} ${time} ${zone}`).toBe(`${day} ${time}`);
    }
  });

  it('refuses text that is not a date and a time', () => {
    expect(() => releaseMoment('21/11/2026', '06:00', 'UTC')).toThrow(/YYYY-MM-DD/);
    expect(() => releaseMoment('2026-11-21', '6am', 'UTC')).toThrow(/HH:MM/);
  });
});

describe('the rule over a publication\u2019s editions', () => {
  const london: ReleaseSettings = { timeZone: 'Europe/London', releaseTime: '06:00', solutionRule: 'next_edition' };
  const editions: ReleaseEdition[] = [
    { number: 40, editionDate: '2026-11-21', state: 'published' },
    { number: 41, editionDate: '2026-11-28', state: 'published' },
    { number: 42, editionDate: '2026-12-05', state: 'approved' },
  ];

  it('keeps an edition private until its release moment, to the millisecond', () => {
    const at = releaseMoment('2026-11-28', '06:00', 'Europe/London');
    expect(releasesOf(editions, london, new Date(at.getTime() - 1)).get(41)?.public).toBe(false);
    expect(releasesOf(editions, london, at).get(41)?.public).toBe(true);
  });

  it('never makes an unpublished edition public, however late', () => {
    expect(releasesOf(editions, london, new Date('2030-01-01T00:00:00Z')).get(42)?.public).toBe(false);
  });

  it('next_edition: solutions follow once a later edition is public, not while it is only published and embargoed', () => {
    const beforeNext = releasesOf(editions, london, new Date('2026-11-28T05:59:59Z'));
    expect(beforeNext.get(40)).toMatchObject({ public: true, solutionsPublic: false });
    // the next edition is published, so the moment is already known
    expect(beforeNext.get(40)?.solutionsFrom?.toISOString()).toBe('2026-11-28T06:00:00.000Z');
    const afterNext = releasesOf(editions, london, new Date('2026-11-28T06:00:00Z'));
    expect(afterNext.get(40)).toMatchObject({ public: true, solutionsPublic: true });
    // the last published edition waits for one that is not published yet: no date known
    expect(afterNext.get(41)).toMatchObject({ public: true, solutionsPublic: false, solutionsFrom: null });
  });

  it('same_edition: solutions are public exactly when the edition is', () => {
    const same: ReleaseSettings = { ...london, solutionRule: 'same_edition' };
    const at = releaseMoment('2026-11-21', '06:00', 'Europe/London');
    expect(releasesOf(editions, same, new Date(at.getTime() - 1)).get(40)).toMatchObject({ public: false, solutionsPublic: false });
    expect(releasesOf(editions, same, at).get(40)).toMatchObject({ public: true, solutionsPublic: true });
    expect(releasesOf(editions, same, at).get(42)).toMatchObject({ public: false, solutionsPublic: false, solutionsFrom: null });
  });
});
