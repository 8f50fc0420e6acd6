import type { ButtonHTMLAttributes } from 'react';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost';

const base =
  'inline-flex items-center justify-center gap-2 rounded-md px-3.5 py-2 text-sm font-medium transition disabled:cursor-not-allowed disabled:opacity-50';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-ink-800 text-white hover:bg-ink-700 shadow-sm',
  secondary: 'border border-ink-300 bg-white text-ink-900 hover:bg-ink-50',
  danger: 'bg-verdict-over text-white hover:bg-red-800 shadow-sm',
  ghost: 'text-ink-800 hover:bg-ink-100',
};

/** Class names of a button, for links and labels that should look like one. */
export function buttonClass(variant: ButtonVariant = 'primary', extra = ''): string {
  return `${base} ${variants[variant]} ${extra}`.trim();
}

export function Button({
  variant = 'primary',
  className = '',
  type = 'button',
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: ButtonVariant }) {
  return <button type={type} className={buttonClass(variant, className)} {...props} />;
}
