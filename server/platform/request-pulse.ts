// How busy the request thread is with people: the HTTP layer beats once per request, and
// background work on the same thread (storing job results, streaming a large export) asks
// before each piece whether requests came in lately, and if so takes only its share of the
// thread, all kinds together (issue 14: storing a large foundry run or exporting the whole
// stock must not queue the desk's requests behind it).
//
// One per process, like the event loop it describes: server/app.ts beats it, the job host
// (server/platform/jobs/host.ts) and the stock export read it. Tests may pass their own.

/** How long after the last request the thread counts as in use by people. */
export const PULSE_WINDOW_MS = 250;

/** The share of the request thread background work (storing job results, streaming an export) may take while people are using the server. */
export const BACKGROUND_SHARE = 0.25;

const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

export class RequestPulse {
  private last = -Infinity;
  /** when background work (of any kind) may run next, performance.now() time */
  private nextAt = 0;
  /** a request has arrived */
  beat(now = performance.now()): void {
    this.last = now;
  }
  /** did a request arrive within the last PULSE_WINDOW_MS? */
  active(now = performance.now()): boolean {
    return now - this.last < PULSE_WINDOW_MS;
  }
  /** wait until background work may run (at once when no requests came in lately) */
  async backgroundTurn(): Promise<void> {
    for (let wait = this.nextAt - performance.now(); wait > 0; wait = this.nextAt - performance.now()) await sleep(wait);
  }
  /**
   * A piece of background work took `busyMs`: while requests come in, the next piece (of any
   * background work) waits busyMs * (1 - share) / share, so all of it together takes at most
   * `share` of the thread.
   */
  backgroundDone(busyMs: number, share = BACKGROUND_SHARE, now = performance.now()): void {
    if (this.active(now)) this.nextAt = Math.max(this.nextAt, now + (busyMs * (1 - share)) / share);
  }
}

/** The request thread's pulse for this process. */
export const processPulse = new RequestPulse();
