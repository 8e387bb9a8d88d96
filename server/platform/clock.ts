// Time comes from a clock in the deps, so tests can move it.
export type Clock = { now(): Date };
export const systemClock: Clock = { now: () => new Date() };
