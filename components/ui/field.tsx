/** A labelled form field with its error sentence in an aria-live region. */
import { forwardRef, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

export const inputClass =
  'min-h-touch w-full rounded-lg border border-line bg-surface px-3 text-ink placeholder:text-muted aria-[invalid=true]:border-danger aria-[invalid=true]:ring-1 aria-[invalid=true]:ring-danger';

export function Field({ id, label, error, hint, children }: { id: string; label: string; error?: string; hint?: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {children}
      {hint && !error && <p className="text-sm text-muted">{hint}</p>}
      <p id={`${id}-error`} aria-live="polite" className="min-h-5 text-sm font-bold text-danger">
        {error}
      </p>
    </div>
  );
}

export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }>(function Input({ invalid, className = '', ...p }, ref) {
  return <input ref={ref} aria-invalid={invalid || undefined} aria-describedby={p.id ? `${p.id}-error` : undefined} className={`${inputClass} ${className}`} {...p} />;
});

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement> & { invalid?: boolean }>(function Select({ invalid, className = '', ...p }, ref) {
  return <select ref={ref} aria-invalid={invalid || undefined} aria-describedby={p.id ? `${p.id}-error` : undefined} className={`${inputClass} ${className}`} {...p} />;
});

export const TextArea = forwardRef<HTMLTextAreaElement, TextareaHTMLAttributes<HTMLTextAreaElement> & { invalid?: boolean }>(function TextArea({ invalid, className = '', ...p }, ref) {
  return <textarea ref={ref} aria-invalid={invalid || undefined} aria-describedby={p.id ? `${p.id}-error` : undefined} className={`${inputClass} min-h-24 py-2 ${className}`} {...p} />;
});

export function Notice({ tone = 'info', children }: { tone?: 'info' | 'error' | 'ok'; children: ReactNode }) {
  const c = tone === 'error' ? 'border-danger text-danger' : tone === 'ok' ? 'border-ok text-ok' : 'border-line text-ink';
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={`rounded-lg border-2 bg-surface p-3 font-bold ${c}`}>
      {children}
    </div>
  );
}
