import type { ComponentProps } from 'react';
import { Link } from 'react-router-dom';
import { cn } from '@/lib/cn';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';
export type ButtonSize = 'sm' | 'md';

const base =
  'inline-flex items-center justify-center gap-2 rounded-sm font-sans font-medium whitespace-nowrap transition-colors disabled:cursor-not-allowed disabled:opacity-60';

const variants: Record<ButtonVariant, string> = {
  primary: 'border border-brass-deep bg-brass text-paper hover:bg-brass-deep',
  secondary: 'border border-ink-soft bg-transparent text-ink hover:bg-paper-deep',
  danger: 'border border-alert bg-transparent text-alert hover:bg-paper-deep',
  quiet: 'border border-transparent bg-transparent text-brass underline-offset-4 hover:underline hover:text-brass-deep',
};

const sizes: Record<ButtonSize, string> = {
  sm: 'px-2.5 py-1 text-sm',
  md: 'px-4 py-2 text-sm',
};

export function buttonClasses(variant: ButtonVariant = 'primary', size: ButtonSize = 'md', className?: string): string {
  return cn(base, variants[variant], sizes[size], className);
}

type ButtonProps = ComponentProps<'button'> & { variant?: ButtonVariant; size?: ButtonSize };

export function Button({ variant = 'primary', size = 'md', className, type = 'button', ...props }: ButtonProps) {
  return <button type={type} className={buttonClasses(variant, size, className)} {...props} />;
}

type ButtonLinkProps = ComponentProps<typeof Link> & { variant?: ButtonVariant; size?: ButtonSize };

/** A link that looks like a button: for going somewhere, not for doing something. */
export function ButtonLink({ variant = 'primary', size = 'md', className, ...props }: ButtonLinkProps) {
  return <Link className={buttonClasses(variant, size, className)} {...props} />;
}

/** The plain in-text link style. */
export const linkClasses = 'text-ink underline decoration-rule decoration-1 underline-offset-4 hover:decoration-brass';
