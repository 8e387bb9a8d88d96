// How busy the request thread is with people: the HTTP layer beats once per request, and
// background work on the same thread (storing job results) asks before each slice whether
// requests came in lately, and if so takes only its share of the thread (issue 14: storing a
// large foundry run must not queue the desk's requests behind it).
//
// One per process, like the event loop it describes: server/app.ts beats it, the job host
// (server/platform/jobs/host.ts) reads it. Tests may pass their own to either.

/** How long after the last request the thread counts as in use by people. */
export const PULSE_WINDOW_MS = 250;

export class RequestPulse {
  private last = -Infinity;
  /** a request has arrived */
  beat(now = performance.now()): void {
    this.last = now;
  }
  /** did a request arrive within the last PULSE_WINDOW_MS? */
  active(now = performance.now()): boolean {
    return now - this.last < PULSE_WINDOW_MS;
  }
}

/** The request thread's pulse for this process. */
export const processPulse = new RequestPulse();
