import type { ComponentProps } from 'react';
import { Link } from 'react-router-dom';
import { cx } from './cx';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';
type Size = 'sm' | 'md' | 'lg';

const BASE =
  'inline-flex items-center justify-center gap-2 rounded-md font-semibold no-underline transition-colors ' +
  'disabled:cursor-not-allowed disabled:opacity-60';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-ink text-paper hover:bg-ink-2',
  secondary: 'border border-rule-strong bg-sheet text-ink hover:bg-shade',
  quiet: 'text-ink underline underline-offset-4 hover:decoration-line',
  danger: 'border border-line-deep bg-sheet text-line-deep hover:bg-shade',
};

const SIZES: Record<Size, string> = {
  sm: 'min-h-8 px-3 text-sm',
  md: 'min-h-10 px-4 text-sm',
  lg: 'min-h-12 px-5 text-base w-full sm:w-auto',
};

export function buttonClass(variant: Variant = 'primary', size: Size = 'md', extra?: string): string {
  return cx(BASE, VARIANTS[variant], variant === 'quiet' ? 'px-1' : SIZES[size], extra);
}

export interface ButtonProps extends ComponentProps<'button'> {
  variant?: Variant;
  size?: Size;
  /** Shows the action is under way and blocks a second press. */
  busy?: boolean;
}

export function Button({ variant, size, busy, className, disabled, children, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClass(variant, size, className)}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {children}
    </button>
  );
}

export interface ButtonLinkProps extends ComponentProps<typeof Link> {
  variant?: Variant;
  size?: Size;
}

export function ButtonLink({ variant = 'secondary', size, className, ...rest }: ButtonLinkProps) {
  return <Link className={buttonClass(variant, size, className)} {...rest} />;
}
