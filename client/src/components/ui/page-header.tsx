import type { ReactNode } from 'react';

export function PageHeader({ title, lead, actions }: { title: string; lead?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-8 flex flex-wrap items-end justify-between gap-4 border-b border-rule pb-5">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight text-ink-900">{title}</h1>
        {lead ? <p className="mt-2 max-w-3xl text-ink-700">{lead}</p> : null}
      </div>
      {actions ? <div className="no-print flex gap-2">{actions}</div> : null}
    </header>
  );
}
