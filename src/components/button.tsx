import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-fig-600 text-white hover:bg-fig-700 disabled:bg-fig-300',
  secondary: 'border border-fig-200 bg-white text-fig-700 hover:bg-fig-50 disabled:opacity-45 disabled:hover:bg-white',
  quiet: 'text-fig-700 hover:bg-fig-50 disabled:opacity-45 disabled:hover:bg-transparent',
  danger: 'bg-red-700 text-white hover:bg-red-800 disabled:opacity-45',
};

export function Button({ variant = 'primary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      className={`inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium transition-colors disabled:cursor-not-allowed ${VARIANTS[variant]} ${className}`}
      {...props}
    />
  );
}
