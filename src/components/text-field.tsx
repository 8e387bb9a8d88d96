import type { InputHTMLAttributes, ReactNode, Ref } from 'react';
import { FieldFrame, controlClasses } from './field';

export interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string | undefined;
  ref?: Ref<HTMLInputElement>;
}

/**
 * A labelled text input with hint and error text. react-hook-form friendly:
 * `<TextField label="Email" {...register('email')} error={errors.email?.message} />`.
 */
export function TextField({ label, hint, error, className, ref, ...input }: TextFieldProps) {
  return (
    <FieldFrame label={label} hint={hint} error={error} className={className}>
      {({ id, describedBy, invalid }) => (
        <input ref={ref} id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} className={controlClasses} {...input} />
      )}
    </FieldFrame>
  );
}
