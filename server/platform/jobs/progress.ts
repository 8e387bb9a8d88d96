import type { StoredProgress } from './port';
import type { JobProgress } from './types';

// A job's progress as the user sees it, from what its parts report and what the server has
// stored. Honest in every phase: the search phases add up over the parts (a phase a part has not
// reached yet counts with the other parts' mean size), and once the search is over the job is in
// its 'storing' phase until every received result is stored, with its own rate and time left.

interface PhaseSeen {
  done: number;
  total: number | undefined;
}

interface PartSeen {
  /** the latest report per phase, phases in the order the part reached them */
  phases: Map<string, PhaseSeen>;
  current: string | undefined;
  found: number;
  finished: boolean;
}

/** A rate measured over a sliding window of samples (units per second). */
class Rate {
  private samples: { t: number; v: number }[] = [];
  constructor(private readonly windowMs = 5_000) {}
  reset(): void {
    this.samples = [];
  }
  add(t: number, v: number): void {
    this.samples.push({ t, v });
    while (this.samples.length > 2 && t - this.samples[0]!.t > this.windowMs) this.samples.shift();
  }
  perSecond(): number | undefined {
    if (this.samples.length < 2) return undefined;
    const a = this.samples[0]!;
    const b = this.samples[this.samples.length - 1]!;
    const dt = b.t - a.t;
    if (dt < 200) return undefined;
    return ((b.v - a.v) * 1000) / dt;
  }
}

export const STORING_PHASE = 'storing results';

export class ProgressTracker {
  private parts: PartSeen[];
  /** phase names in the order first seen: a phase earlier in this list is less advanced */
  private order: string[] = [];
  private shownPhase: string | undefined;
  private readonly searchRate = new Rate();
  private readonly storeRate = new Rate();
  received = 0;
  stored = 0;

  constructor(
    partCount: number,
    private readonly startedAt: number,
    finishedParts: ReadonlySet<number> = new Set(),
  ) {
    this.parts = Array.from({ length: partCount }, (_, i) => ({ phases: new Map(), current: undefined, found: 0, finished: finishedParts.has(i) }));
  }

  report(part: number, p: JobProgress, now: number): void {
    const s = this.parts[part];
    if (!s) return;
    const phase = p.phase ?? '';
    if (!this.order.includes(phase)) this.order.push(phase);
    s.phases.set(phase, { done: p.done, total: p.total });
    s.current = phase;
    if (p.found !== undefined) s.found = p.found;
    const v = this.searchView();
    if (v && v.phase === this.shownPhase) this.searchRate.add(now, v.done);
    else if (v) {
      this.shownPhase = v.phase;
      this.searchRate.reset();
      this.searchRate.add(now, v.done);
    }
  }

  /** The part was restarted (a worker died): what it had reported no longer counts. */
  restartPart(part: number): void {
    const s = this.parts[part];
    if (s) Object.assign(s, { phases: new Map(), current: undefined, found: 0, finished: false });
  }

  finishPart(part: number): void {
    const s = this.parts[part];
    if (s) s.finished = true;
  }

  addReceived(n: number): void {
    this.received += n;
  }

  addStored(n: number, now: number): void {
    this.stored += n;
    this.storeRate.add(now, this.stored);
  }

  /** The least advanced phase over the parts still searching, summed over all parts. */
  private searchView(): { phase: string; done: number; total: number | undefined } | null {
    const running = this.parts.filter((s) => !s.finished && s.current !== undefined);
    if (running.length === 0) return null;
    const rank = (s: PartSeen) => this.order.indexOf(s.current!);
    const phase = running.reduce((a, s) => (rank(s) < rank(a) ? s : a)).current!;
    const rankOf = this.order.indexOf(phase);
    let done = 0;
    let total = 0;
    let totalKnown = true;
    const sizes: number[] = [];
    let missing = 0;
    for (const s of this.parts) {
      const seen = s.phases.get(phase);
      if (seen) {
        done += seen.done;
        if (seen.total === undefined) totalKnown = false;
        else {
          total += seen.total;
          sizes.push(seen.total);
        }
      } else if (s.finished || (s.current !== undefined && this.order.indexOf(s.current) > rankOf)) {
        // finished or past this phase without reporting it: nothing left of it there
      } else missing++;
    }
    if (missing > 0 && sizes.length > 0) total += Math.round((sizes.reduce((a, b) => a + b, 0) / sizes.length) * missing);
    return { phase, done, total: totalKnown && sizes.length > 0 ? total : undefined };
  }

  view(now: number): StoredProgress {
    const count = this.parts.length;
    const partsDone = this.parts.filter((s) => s.finished).length;
    const found = this.parts.reduce((a, s) => a + s.found, 0);
    const pending = this.received - this.stored;
    const storeRate = this.storeRate.perSecond();
    const storeEta = pending > 0 && storeRate && storeRate > 0 ? Math.round((pending / storeRate) * 1000) : pending > 0 ? undefined : 0;
    const base = {
      found: Math.max(found, this.received),
      elapsedMs: now - this.startedAt,
      stored: this.stored,
      received: this.received,
      ...(count > 1 ? { parts: { done: partsDone, count } } : {}),
    };
    const v = this.searchView();
    if (!v) {
      // every part has finished searching: what is left is storing
      const out: StoredProgress = { ...base, phase: STORING_PHASE, done: this.stored, total: this.received };
      if (storeRate !== undefined) out.rate = round1(storeRate);
      if (storeEta !== undefined) out.etaMs = storeEta;
      return out;
    }
    const out: StoredProgress = { ...base, phase: v.phase, done: v.done };
    if (v.total !== undefined) out.total = v.total;
    const rate = this.searchRate.perSecond();
    if (rate !== undefined) out.rate = round1(rate);
    if (v.total !== undefined && rate !== undefined && rate > 0) {
      const searchEta = Math.round(((v.total - v.done) / rate) * 1000);
      out.etaMs = Math.max(searchEta, storeEta ?? 0);
    }
    return out;
  }
}

const round1 = (x: number) => Math.round(x * 10) / 10;
