import type { ButtonHTMLAttributes } from 'react';
import { cn } from '@/lib/cn';
import { Spinner } from './spinner';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost';
export type ButtonSize = 'sm' | 'md';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-pine-700 text-white hover:bg-pine-800 disabled:bg-pine-700/60',
  secondary: 'border border-canvas-300 bg-white text-canvas-900 hover:bg-canvas-100 disabled:text-canvas-500',
  danger: 'bg-rust-700 text-white hover:bg-rust-800 disabled:bg-rust-700/60',
  ghost: 'text-canvas-800 hover:bg-canvas-100 disabled:text-canvas-500',
};

const sizes: Record<ButtonSize, string> = {
  sm: 'min-h-8 px-3 py-1 text-sm',
  md: 'min-h-10 px-4 py-2 text-base',
};

/** Classes for anything that should look like a button (also links). */
export function buttonClasses(variant: ButtonVariant = 'primary', size: ButtonSize = 'md', className?: string) {
  return cn(
    'inline-flex items-center justify-center gap-2 rounded-md font-semibold transition-colors disabled:cursor-not-allowed',
    variants[variant],
    sizes[size],
    className,
  );
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** While true the button is disabled and shows progress; its name stays the same. */
  isLoading?: boolean;
}

export function Button({ variant = 'primary', size = 'md', isLoading = false, className, disabled, children, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={buttonClasses(variant, size, className)}
      disabled={disabled || isLoading}
      aria-busy={isLoading || undefined}
      {...rest}
    >
      {isLoading ? <Spinner /> : null}
      {children}
    </button>
  );
}
