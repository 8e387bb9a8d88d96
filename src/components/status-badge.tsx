import type { Tone } from './alert';

const classes: Record<Tone, string> = {
  info: 'bg-info-soft text-info border-info/40',
  success: 'bg-success-soft text-success border-success/40',
  warning: 'bg-warning-soft text-warning border-warning/40',
  danger: 'bg-danger-soft text-danger border-danger/40',
  neutral: 'bg-paper-deep text-ink-muted border-rule-strong',
};
const glyph: Record<Tone, string> = { info: '●', success: '✓', warning: '!', danger: '✕', neutral: '○' };

/**
 * A state label: always text plus a muted colour and a glyph, never colour alone.
 * `<StatusBadge tone="success">Accepted</StatusBadge>`.
 */
export function StatusBadge({ tone = 'neutral', children }: { tone?: Tone; children: string }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold whitespace-nowrap ${classes[tone]}`}>
      <span aria-hidden>{glyph[tone]}</span>
      {children}
    </span>
  );
}
