import { forwardRef, type ButtonHTMLAttributes, type ReactNode } from 'react';
import { cn } from './cn';
import { Spinner } from './spinner';

export type ButtonVariant = 'primary' | 'secondary' | 'ghost' | 'danger';
export type ButtonSize = 'md' | 'sm';

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a spinner, marks the button busy and ignores clicks until the work is done. */
  loading?: boolean;
  /** Optional icon before the label. */
  icon?: ReactNode;
}

const variantClasses: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-accent-ink border-accent hover:bg-accent-hover hover:border-accent-hover',
  secondary: 'bg-surface text-ink border-line-strong hover:bg-sunk',
  ghost: 'bg-transparent text-ink border-transparent hover:bg-sunk',
  danger: 'bg-fail text-accent-ink border-fail hover:opacity-90',
};

/** Class names of a button, for links that should look like one. */
export function buttonClasses(variant: ButtonVariant = 'primary', size: ButtonSize = 'md', className?: string): string {
  return cn(
    'inline-flex items-center justify-center gap-2 rounded-md border-2 font-bold no-underline select-none',
    'transition-colors disabled:cursor-not-allowed disabled:opacity-60',
    // Even the small size keeps a 44 px hit area on touch screens.
    size === 'md' ? 'min-h-touch px-4 text-base' : 'min-h-touch px-3 text-sm',
    variantClasses[variant],
    className,
  );
}

/**
 * The one button. `loading` keeps the label (so the width does not jump), adds a spinner and
 * `aria-busy`, and blocks repeated submits.
 */
export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = 'primary', size = 'md', loading = false, icon, className, children, disabled, type = 'button', onClick, ...rest },
  ref,
) {
  return (
    <button
      ref={ref}
      type={type}
      className={buttonClasses(variant, size, className)}
      disabled={disabled}
      aria-busy={loading || undefined}
      aria-disabled={loading || undefined}
      onClick={(event) => {
        if (loading) {
          event.preventDefault();
          return;
        }
        onClick?.(event);
      }}
      {...rest}
    >
      {loading ? <Spinner size={18} /> : icon}
      <span>{children}</span>
    </button>
  );
});
