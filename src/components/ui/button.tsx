import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'ghost' | 'danger';

const styles: Record<Variant, string> = {
  primary: 'bg-copper text-white hover:bg-copper-dark border-copper',
  secondary: 'bg-card text-ink border-line hover:border-ink-soft',
  ghost: 'bg-transparent text-ink border-transparent hover:bg-black/5',
  danger: 'bg-card text-danger border-danger/40 hover:bg-danger-soft',
};

export function Button({ variant = 'secondary', className = '', type = 'button', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return (
    <button
      type={type}
      className={`inline-flex items-center justify-center gap-2 rounded-md border px-3 py-1.5 text-sm font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-50 ${styles[variant]} ${className}`}
      {...props}
    />
  );
}
