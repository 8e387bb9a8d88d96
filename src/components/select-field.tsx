import type { ReactNode, Ref, SelectHTMLAttributes } from 'react';
import { FieldFrame, controlClasses } from './field';

export interface SelectOption {
  value: string;
  label: string;
}

export interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: ReactNode;
  options: readonly SelectOption[];
  hint?: ReactNode;
  error?: string | undefined;
  /** Adds a first empty option with this label (e.g. "Any"). */
  placeholder?: string;
  ref?: Ref<HTMLSelectElement>;
}

/** A labelled native select with hint and error text; react-hook-form friendly like TextField. */
export function SelectField({ label, options, hint, error, placeholder, className, ref, ...select }: SelectFieldProps) {
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className}>
      {({ id, describedBy, invalid }) => (
        <select ref={ref} id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} className={controlClasses} {...select}>
          {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </FieldFrame>
  );
}
