import type { ReactNode } from 'react';
import { ApiError } from '@/lib/api-client';

/** Shown while data loads; announced politely to screen readers. */
export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-3 py-10 text-ink-500">
      <span className="inline-block h-2 w-2 animate-pulse rounded-full bg-accent-500" aria-hidden />
      {label}
    </div>
  );
}

export function Empty({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-md border border-dashed border-ink-300 bg-panel px-6 py-10 text-center">
      <p className="font-medium text-ink-700">{title}</p>
      {children ? <div className="mt-2 text-sm text-ink-500">{children}</div> : null}
    </div>
  );
}

/** An error in plain words, with a retry when the caller offers one. */
export function ErrorState({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  const message = error instanceof ApiError || error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <div role="alert" className="rounded-md border-l-4 border-serious bg-serious-50 px-5 py-4">
      <p className="font-medium text-ink-900">This could not be loaded.</p>
      <p className="mt-1 text-sm text-ink-700">{message}</p>
      {onRetry ? (
        <button type="button" onClick={onRetry} className="mt-3 rounded border border-ink-300 bg-panel px-3 py-1 text-sm hover:border-ink-500">
          Try again
        </button>
      ) : null}
    </div>
  );
}
