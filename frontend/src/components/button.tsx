import type { ButtonHTMLAttributes } from 'react';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: ButtonVariant;
  size?: 'sm' | 'md';
  /** shows the button as busy and disables it */
  busy?: boolean;
};

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-moss-700 text-white hover:bg-moss-800 border-moss-700',
  secondary: 'bg-white text-moss-800 hover:bg-moss-50 border-moss-300',
  quiet: 'bg-transparent text-slate-700 hover:bg-slate-100 border-transparent',
  danger: 'bg-signal-600 text-white hover:bg-signal-700 border-signal-600',
};

const sizes = { sm: 'px-2.5 py-1 text-sm', md: 'px-4 py-2 text-sm' };

export function Button({
  variant = 'primary',
  size = 'md',
  busy = false,
  type = 'button',
  disabled,
  className = '',
  children,
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded-md border font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${variants[variant]} ${sizes[size]} ${className}`}
      {...rest}
    >
      {children}
    </button>
  );
}
