import type { ComponentPropsWithRef, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router';
import { cx } from '@/lib/cx';
import { Spinner } from './Spinner';

export type ButtonTone = 'primary' | 'secondary' | 'danger' | 'quiet';

const base =
  'inline-flex min-h-11 min-w-11 items-center justify-center gap-2 rounded-control px-4 py-2 text-base font-medium ' +
  'no-underline transition-colors disabled:cursor-not-allowed disabled:opacity-60 select-none';

const tones: Record<ButtonTone, string> = {
  primary: 'bg-accent text-accent-ink hover:bg-accent-strong border border-transparent',
  secondary: 'border border-field bg-surface text-ink hover:bg-sunken',
  danger: 'border-2 border-bad bg-surface text-bad hover:bg-bad-soft font-bold',
  quiet: 'border border-transparent bg-transparent text-ink hover:bg-sunken',
};

export function buttonClass(tone: ButtonTone = 'secondary', className?: string) {
  return cx(base, tones[tone], className);
}

interface ButtonProps extends ComponentPropsWithRef<'button'> {
  tone?: ButtonTone;
  /** Shows a spinner and blocks clicks while the action runs. */
  busy?: boolean;
  icon?: ReactNode;
}

/** A button with a 44 x 44 px target. `tone="primary"` is the accent: one per view, for the main action. */
export function Button({ tone = 'secondary', busy = false, icon, className, children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClass(tone, className)}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy ? <Spinner /> : icon}
      {children}
    </button>
  );
}

/** A router link that looks like a button. */
export function ButtonLink({ tone = 'secondary', className, ...rest }: LinkProps & { tone?: ButtonTone }) {
  return <Link className={buttonClass(tone, className)} {...rest} />;
}
