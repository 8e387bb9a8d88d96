import type { ButtonHTMLAttributes, Ref } from 'react';
import { Link, type LinkProps } from 'react-router-dom';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost';
export type ButtonSize = 'sm' | 'md';

const base =
  'inline-flex items-center justify-center gap-2 rounded-md font-medium transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-focus disabled:cursor-not-allowed disabled:opacity-55';
const variants: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-accent-ink hover:bg-accent-strong border border-accent-strong',
  secondary: 'bg-surface text-ink border border-rule-strong hover:bg-paper-deep',
  danger: 'bg-surface text-danger border border-danger/60 hover:bg-danger-soft',
  ghost: 'bg-transparent text-ink hover:bg-paper-deep border border-transparent',
};
const sizes: Record<ButtonSize, string> = { sm: 'h-8 px-3 text-sm', md: 'h-10 px-4 text-[0.95rem]' };

/** Class names of a button, for elements that must look like one (e.g. a download link). */
export function buttonClasses(variant: ButtonVariant = 'secondary', size: ButtonSize = 'md'): string {
  return `${base} ${variants[variant]} ${sizes[size]}`;
}

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a busy label and disables the button while an action runs. */
  busy?: boolean;
  ref?: Ref<HTMLButtonElement>;
}

/** The one button. `primary` (warm accent) for the main action of a view, `secondary` otherwise. Defaults to type="button". */
export function Button({ variant = 'secondary', size = 'md', busy = false, className = '', type = 'button', disabled, children, ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={`${buttonClasses(variant, size)} ${className}`}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy ? <span className="size-3 animate-spin rounded-full border-2 border-current border-r-transparent" aria-hidden /> : null}
      {children}
    </button>
  );
}

/** A router link styled as a button (for navigation that looks like an action). */
export function ButtonLink({ variant = 'secondary', size = 'md', className = '', ...rest }: LinkProps & { variant?: ButtonVariant; size?: ButtonSize }) {
  return <Link className={`${buttonClasses(variant, size)} ${className}`} {...rest} />;
}
