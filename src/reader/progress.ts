// A reader's progress on one puzzle, kept in this browser's local storage (nothing else is
// stored on the reader's side: no cookie). The play id is a random UUID made here; it is the
// only thing that ties a play's anonymous events together on the server.

export type Placement = { piece: number; x: number; y: number };
export type Entry = { square: number; size: number };

export type Progress = {
  playId: string;
  /** Assembly: pieces on the board (starters not included) */
  placements: Placement[];
  /** Deduction: sizes typed into squares (givens not included) */
  entries: Entry[];
  elapsedMs: number;
  started: boolean;
  finished: boolean;
  /** pieces or squares revealed so far */
  revealed: number;
  checks: number;
};

const PREFIX = 'squarewright:reader:v1:';

export function newProgress(): Progress {
  return { playId: crypto.randomUUID(), placements: [], entries: [], elapsedMs: 0, started: false, finished: false, revealed: 0, checks: 0 };
}

function isProgress(v: unknown): v is Progress {
  if (typeof v !== 'object' || v === null) return false;
  const p = v as Record<string, unknown>;
  return (
    typeof p.playId === 'string' &&
    Array.isArray(p.placements) &&
    Array.isArray(p.entries) &&
    typeof p.elapsedMs === 'number' &&
    typeof p.started === 'boolean' &&
    typeof p.finished === 'boolean' &&
    typeof p.revealed === 'number' &&
    typeof p.checks === 'number'
  );
}

/** The saved progress for a puzzle, or a fresh one (storage blocked or unreadable: a fresh one, not saved). */
export function loadProgress(key: string): Progress {
  try {
    const raw = window.localStorage.getItem(PREFIX + key);
    if (raw) {
      const parsed: unknown = JSON.parse(raw);
      if (isProgress(parsed)) return parsed;
    }
  } catch {
    // private mode or storage disabled: play without saving
  }
  return newProgress();
}

export function saveProgress(key: string, p: Progress): void {
  try {
    window.localStorage.setItem(PREFIX + key, JSON.stringify(p));
  } catch {
    // storage full or disabled: the play goes on unsaved
  }
}

export function clearProgress(key: string): void {
  try {
    window.localStorage.removeItem(PREFIX + key);
  } catch {
    // nothing to clear
  }
}
