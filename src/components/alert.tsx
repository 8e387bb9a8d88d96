import type { ReactNode } from 'react';
import { errorMessage } from '../lib/api-client';

export type Tone = 'info' | 'success' | 'warning' | 'danger' | 'neutral';

const toneClasses: Record<Tone, string> = {
  info: 'border-info/40 bg-info-soft text-ink',
  success: 'border-success/40 bg-success-soft text-ink',
  warning: 'border-warning/40 bg-warning-soft text-ink',
  danger: 'border-danger/40 bg-danger-soft text-ink',
  neutral: 'border-rule-strong bg-paper-deep text-ink',
};
const toneWord: Record<Tone, string> = { info: 'Note', success: 'Done', warning: 'Caution', danger: 'Error', neutral: 'Note' };
const barClasses: Record<Tone, string> = {
  info: 'bg-info',
  success: 'bg-success',
  warning: 'bg-warning',
  danger: 'bg-danger',
  neutral: 'bg-ink-muted',
};

export interface AlertProps {
  tone?: Tone;
  /** Bold first line; defaults to a word naming the tone, so colour is never the only signal. */
  title?: ReactNode;
  children?: ReactNode;
  className?: string;
}

/**
 * A message box. `danger` alerts are announced at once (role="alert"); the others
 * politely (role="status").
 */
export function Alert({ tone = 'info', title, children, className = '' }: AlertProps) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`flex gap-3 rounded-md border p-3 ${toneClasses[tone]} ${className}`}>
      <span className={`w-1 shrink-0 rounded-full ${barClasses[tone]}`} aria-hidden />
      <div className="flex flex-col gap-0.5 text-sm">
        <p className="font-semibold">{title ?? toneWord[tone]}</p>
        {children ? <div className="text-ink-soft">{children}</div> : null}
      </div>
    </div>
  );
}

/**
 * The message of a failed query or mutation (an ApiError or any Error) as a danger Alert, or
 * nothing while there is no error: `<ErrorAlert error={save.error} title="Could not save" />`.
 */
export function ErrorAlert({ error, title, className }: { error: unknown; title?: ReactNode; className?: string }) {
  if (!error) return null;
  return (
    <Alert tone="danger" title={title} className={className}>
      {errorMessage(error)}
    </Alert>
  );
}
