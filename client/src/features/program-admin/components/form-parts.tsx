import type { ReactNode } from 'react';
import type { FieldError } from 'react-hook-form';
import { fieldError, fieldLabel } from '@/components/ui/styles';

/** A labelled field with its error, linked for screen readers. */
export function Field({ id, label, hint, error, children }: { id: string; label: string; hint?: string; error?: FieldError | { message?: string }; children: ReactNode }) {
  return (
    <div>
      <label htmlFor={id} className={fieldLabel}>
        {label}
      </label>
      {children}
      {hint ? <p className="mt-1 text-xs text-ink-500">{hint}</p> : null}
      {error?.message ? (
        <p id={`${id}-error`} className={fieldError} role="alert">
          {error.message}
        </p>
      ) : null}
    </div>
  );
}

/** "Saved." or the server's plain message after a save. */
export function SaveStatus({ success, error }: { success: boolean; error: unknown }) {
  if (error) return <p role="alert" className="text-sm text-serious">{error instanceof Error ? error.message : 'This could not be saved.'}</p>;
  if (success) return <p role="status" className="text-sm text-accent-700">Saved.</p>;
  return null;
}

export function Section({ title, lead, children }: { title: string; lead?: string; children: ReactNode }) {
  return (
    <section className="mb-10 rounded-lg border border-rule bg-panel p-6" aria-label={title}>
      <h2 className="text-lg font-semibold text-ink-900">{title}</h2>
      {lead ? <p className="mt-1 mb-4 max-w-3xl text-sm text-ink-500">{lead}</p> : <div className="mb-4" />}
      {children}
    </section>
  );
}
