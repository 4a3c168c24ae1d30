import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from 'react';

export const inputClass =
  'mt-1 block w-full rounded border border-grid-major bg-paper px-3 py-2 text-ink aria-[invalid=true]:border-brick disabled:cursor-not-allowed disabled:opacity-70 dark:border-night-line dark:bg-night dark:text-paper';

/** A labelled input with its error beside it (aria-describedby links them for screen readers). */
export function TextField({ id, label, error, hint, ...input }: { id: string; label: string; error?: string; hint?: ReactNode } & InputHTMLAttributes<HTMLInputElement>) {
  const described = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div>
      <label htmlFor={id} className="text-sm font-medium">
        {label}
      </label>
      <input id={id} aria-invalid={error ? true : undefined} aria-describedby={described} className={inputClass} {...input} />
      {hint && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink/65 dark:text-paper/65">
          {hint}
        </p>
      ) : null}
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}

export function SelectField({ id, label, error, children, ...select }: { id: string; label: string; error?: string; children: ReactNode } & SelectHTMLAttributes<HTMLSelectElement>) {
  return (
    <div>
      <label htmlFor={id} className="text-sm font-medium">
        {label}
      </label>
      <select id={id} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : undefined} className={inputClass} {...select}>
        {children}
      </select>
      <FieldError id={`${id}-error`} message={error} />
    </div>
  );
}

export function FieldError({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="mt-1 text-sm font-medium text-brick dark:text-[#e07a6a]">
      {message}
    </p>
  );
}

/** A message about the whole form (role="alert" so it is announced). */
export function FormAlert({ message, tone = 'over' }: { message: string | null; tone?: 'over' | 'pass' }) {
  if (!message) return null;
  const cls = tone === 'over' ? 'border-brick text-brick dark:text-[#e07a6a]' : 'border-moss text-moss dark:text-[#7fbf8e]';
  return (
    <p role={tone === 'over' ? 'alert' : 'status'} className={`rounded border-l-4 bg-card px-3 py-2 text-sm font-medium dark:bg-night-card ${cls}`}>
      {message}
    </p>
  );
}

export const primaryButton =
  'rounded bg-ink px-4 py-2 font-medium text-paper hover:bg-ink/90 disabled:cursor-wait disabled:opacity-60 dark:bg-paper dark:text-ink';
export const secondaryButton =
  'rounded border border-ink/30 px-3 py-1.5 text-sm font-medium hover:border-ink hover:bg-card disabled:opacity-60 dark:border-paper/30 dark:hover:border-paper dark:hover:bg-night-card';
export const dangerButton =
  'rounded border border-brick/50 px-3 py-1.5 text-sm font-medium text-brick hover:bg-brick/10 disabled:opacity-60 dark:text-[#e07a6a]';
