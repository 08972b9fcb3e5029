import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';
type Size = 'sm' | 'md';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-iron-800 text-paper-50 hover:bg-iron-900 border border-iron-900',
  secondary: 'bg-white text-ink-900 hover:bg-paper-100 border border-paper-400',
  quiet: 'bg-transparent text-iron-700 hover:bg-iron-50 border border-transparent',
  danger: 'bg-danger-700 text-white hover:bg-[#7f2217] border border-danger-700',
};
const SIZES: Record<Size, string> = {
  sm: 'h-8 px-2.5 text-sm',
  md: 'h-9 px-3.5 text-sm',
};

export function buttonClasses(variant: Variant = 'secondary', size: Size = 'md', extra = ''): string {
  return [
    'inline-flex items-center justify-center gap-1.5 rounded font-medium whitespace-nowrap',
    'disabled:cursor-not-allowed disabled:opacity-60',
    VARIANTS[variant],
    SIZES[size],
    extra,
  ].join(' ');
}

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  size?: Size;
}

export function Button({ variant = 'secondary', size = 'md', className = '', type = 'button', ...rest }: ButtonProps) {
  return <button type={type} className={buttonClasses(variant, size, className)} {...rest} />;
}
