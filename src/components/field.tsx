import { useId, type ReactNode } from 'react';

export interface FieldFrameProps {
  /** The visible label (required: every field is labelled). */
  label: ReactNode;
  /** Short help under the label. */
  hint?: ReactNode;
  /** Error text; marks the control invalid and is announced with it. */
  error?: string | undefined;
  /** The control; receives the ids to wire up. */
  children: (ids: { id: string; describedBy: string | undefined; invalid: boolean }) => ReactNode;
  className?: string;
}

/** Label + control + hint + error, wired with ids and aria-describedby. Used by TextField, SelectField. */
export function FieldFrame({ label, hint, error, children, className = '' }: FieldFrameProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {children({ id, describedBy, invalid: Boolean(error) })}
      {error ? (
        <p id={errorId} className="text-sm font-medium text-danger">
          {error}
        </p>
      ) : null}
    </div>
  );
}

/** Shared look of text inputs and selects. */
export const controlClasses =
  'h-10 w-full rounded-md border border-rule-strong bg-surface px-3 text-ink placeholder:text-ink-faint focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-focus aria-[invalid=true]:border-danger';
