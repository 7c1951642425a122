import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const VARIANT: Record<Variant, string> = {
  primary: 'bg-accent text-paper-bright border-accent hover:bg-accent-strong hover:border-accent-strong',
  secondary: 'bg-paper-bright text-ink border-paper-edge hover:bg-paper-deep',
  danger: 'bg-paper-bright text-fail border-fail/50 hover:bg-fail-tint',
  quiet: 'bg-transparent text-accent border-transparent hover:bg-accent-tint',
};

export const buttonClass = (variant: Variant = 'secondary', size: 'md' | 'sm' = 'md') =>
  [
    'inline-flex items-center justify-center gap-2 rounded-md border font-medium transition-colors',
    'disabled:cursor-not-allowed disabled:opacity-60',
    size === 'md' ? 'min-h-10 px-4 text-sm' : 'min-h-8 px-2.5 text-sm',
    VARIANT[variant],
  ].join(' ');

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: 'md' | 'sm';
  /** Shows the busy text and disables the button while a request runs. */
  busy?: boolean;
  busyText?: string;
}

export function Button({
  variant = 'secondary',
  size = 'md',
  busy,
  busyText,
  className,
  children,
  disabled,
  type = 'button',
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      className={`${buttonClass(variant, size)} ${className ?? ''}`}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      {...rest}
    >
      {busy && busyText ? busyText : children}
    </button>
  );
}
