import type { ButtonHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-fern text-sheet hover:bg-fern/90 disabled:bg-fern/50',
  secondary: 'border border-rule bg-sheet text-ink hover:bg-paper disabled:text-ink-soft/60 disabled:hover:bg-sheet dark:border-night-rule dark:bg-night-sheet dark:text-night-ink dark:hover:bg-night dark:disabled:text-night-ink-soft/60',
  quiet: 'text-fern hover:bg-fern-soft disabled:text-ink-soft/60 disabled:hover:bg-transparent dark:text-fern-bright dark:hover:bg-night-sheet',
  danger: 'bg-short text-sheet hover:bg-short/90 disabled:bg-short/50',
};

export function Button({ variant = 'primary', className, type = 'button', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={cn('inline-flex items-center justify-center gap-2 rounded-md px-3.5 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed', VARIANTS[variant], className)}
      {...props}
    />
  );
}
