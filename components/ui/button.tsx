/** Buttons sized for gloved hands: at least 44 px tall. */
import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'ghost' | 'danger';

const styles: Record<Variant, string> = {
  primary: 'bg-brand text-brand-ink hover:opacity-90',
  secondary: 'bg-raised text-ink border border-line hover:bg-surface',
  ghost: 'text-ink hover:bg-raised',
  danger: 'bg-danger text-white hover:opacity-90 dark:text-paper',
};

export function buttonClass(variant: Variant = 'primary', extra = ''): string {
  return `inline-flex min-h-touch items-center justify-center gap-2 rounded-lg px-4 font-bold transition disabled:cursor-not-allowed disabled:opacity-50 ${styles[variant]} ${extra}`;
}

export function Button({ variant = 'primary', className = '', ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button className={buttonClass(variant, className)} {...props} />;
}
