import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router';
import { cx } from '@/lib/class-names';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';
export type ButtonSize = 'sm' | 'md' | 'lg';

const base =
  'inline-flex items-center justify-center gap-2 rounded-md font-medium whitespace-nowrap transition-colors ' +
  'disabled:opacity-55 aria-disabled:opacity-55 select-none';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-accent-strong text-white hover:bg-[#9c441a] active:bg-[#8a3c17] border border-accent-strong',
  secondary: 'bg-surface text-ink border border-line-strong hover:border-ink hover:bg-mist',
  quiet: 'bg-transparent text-ink border border-transparent hover:bg-mist',
  danger: 'bg-surface text-overdue border border-overdue/60 hover:bg-overdue-tint hover:border-overdue',
};

const sizes: Record<ButtonSize, string> = {
  sm: 'h-8 px-3 text-sm pointer-coarse:h-11',
  md: 'h-10 px-4 text-[0.9375rem] pointer-coarse:h-12',
  lg: 'h-12 px-5 text-base pointer-coarse:h-14',
};

export function buttonClasses(variant: ButtonVariant = 'secondary', size: ButtonSize = 'md', extra?: string) {
  return cx(base, variants[variant], sizes[size], extra);
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a busy state and blocks repeat clicks while an action runs. */
  busy?: boolean;
  children: ReactNode;
}

export function Button({ variant = 'secondary', size = 'md', busy, className, disabled, children, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, size, className)}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy ? <BusyDot /> : null}
      {children}
    </button>
  );
}

interface ButtonLinkProps extends LinkProps {
  variant?: ButtonVariant;
  size?: ButtonSize;
}

/** A link that looks like a button, for navigation that reads as an action ("Open vehicles"). */
export function ButtonLink({ variant = 'secondary', size = 'md', className, ...rest }: ButtonLinkProps) {
  return <Link className={buttonClasses(variant, size, className)} {...rest} />;
}

function BusyDot() {
  return (
    <span aria-hidden="true" className="inline-block size-3 animate-spin rounded-full border-2 border-current border-r-transparent" />
  );
}
