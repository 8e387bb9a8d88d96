import type { PuzzleLevel, PuzzleStatus } from '../../../../shared/contracts/puzzles';
import type { Tone } from '../../../components/alert';

export const statusLabel: Record<PuzzleStatus, string> = {
  proving: 'Proving',
  unique: 'Unique',
  multiple: 'Several solutions',
  none: 'No solution',
  undecided: 'Undecided',
  stuck: 'Stuck at this level',
  'not-unique': 'Not unique',
  failed: 'Proof failed',
  cancelled: 'Cancelled',
};

export const statusTone: Record<PuzzleStatus, Tone> = {
  proving: 'info',
  unique: 'success',
  multiple: 'danger',
  none: 'danger',
  undecided: 'warning',
  stuck: 'warning',
  'not-unique': 'danger',
  failed: 'danger',
  cancelled: 'neutral',
};

export const kindLabel = { assembly: 'Assembly', deduction: 'Deduction' } as const;

export function levelLabel(level: PuzzleLevel | null): string {
  if (level === null) return '–';
  return level === 'closure' ? 'Full closure' : `Level ${level}`;
}

/** Level choices for the forms: 1..6 and the full closure. */
export const levelOptions = [1, 2, 3, 4, 5, 6].map((k) => ({ value: String(k), label: `Level ${k}` })).concat([{ value: 'closure', label: 'Full closure' }]);

export function parseLevel(v: string): PuzzleLevel | undefined {
  if (v === 'closure') return 'closure';
  const n = Number(v);
  return Number.isInteger(n) && n >= 1 ? n : undefined;
}
