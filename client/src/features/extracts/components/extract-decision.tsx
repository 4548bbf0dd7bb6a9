import { useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { ExtractDetailDto } from '@shared/api/extracts';
import { formatDateTime } from '@/lib/format';
import { useDecideExtract, type ExtractAction } from '../api/decide-extract';

/**
 * What the analyst can decide now: accept (rejected rows left out) or reject a checked file,
 * restore a superseded one, retry a failed one. Says what accepting will replace.
 */
export function ExtractDecision({ extract, programId, timeZone }: { extract: ExtractDetailDto; programId: number; timeZone: string }) {
  const decide = useDecideExtract(programId, extract.id);
  const [note, setNote] = useState('');
  const act = (action: ExtractAction) => decide.mutate({ action, note: note.trim() || undefined });
  const button = 'rounded px-4 py-2 font-medium disabled:opacity-50';
  const busy = decide.isPending;

  let body: ReactNode = null;
  if (extract.status === 'awaiting-decision' || extract.status === 'uploaded') {
    body = (
      <>
        {extract.replaces ? (
          <p className="text-sm text-ink-700">
            Accepting replaces the extract accepted{' '}
            {extract.replaces.acceptedAt ? `on ${formatDateTime(extract.replaces.acceptedAt, timeZone)}` : 'before'} for this month (
            <Link to={`/programs/${programId}/extracts/${extract.replaces.id}`} className="text-accent-700 underline underline-offset-4">
              extract {extract.replaces.id}
            </Link>
            , {extract.replaces.rowsAccepted?.toLocaleString() ?? '—'} rows). It stays on record and can be restored.
          </p>
        ) : null}
        <label className="mt-3 block text-sm text-ink-700">
          Note for the record (optional)
          <input value={note} onChange={(e) => setNote(e.target.value)} maxLength={500} className="mt-1 block w-full rounded border border-ink-300 bg-panel px-2 py-1.5" />
        </label>
        <div className="mt-4 flex flex-wrap gap-3">
          {extract.status === 'awaiting-decision' ? (
            <button type="button" onClick={() => act('accept')} disabled={!extract.canAccept || busy} className={`${button} bg-accent-700 text-white enabled:hover:bg-accent-900`}>
              {extract.report && extract.report.rowsRejected > 0 ? `Accept without the ${extract.report.rowsRejected.toLocaleString()} rejected rows` : 'Accept'}
            </button>
          ) : null}
          <button type="button" onClick={() => act('reject')} disabled={busy} className={`${button} border border-ink-300 bg-panel text-ink-900 enabled:hover:border-ink-500`}>
            Reject this file
          </button>
        </div>
        {!extract.canAccept && extract.status === 'awaiting-decision' ? (
          <p className="mt-2 text-sm text-ink-500">Accepting is not possible while the report shows a problem: correct the file or the mapping, or reject it.</p>
        ) : null}
      </>
    );
  } else if (extract.status === 'superseded') {
    body = extract.observationsPurgedAt ? (
      <p className="text-sm text-ink-700">Its rows were deleted by the retention rule, so it cannot be restored.</p>
    ) : (
      <>
        <p className="text-sm text-ink-700">
          A later file for this month replaced it
          {extract.supersededById ? (
            <>
              {' '}
              (
              <Link to={`/programs/${programId}/extracts/${extract.supersededById}`} className="text-accent-700 underline underline-offset-4">
                extract {extract.supersededById}
              </Link>
              )
            </>
          ) : null}
          . Its rows are kept: restoring makes them this month’s data again.
        </p>
        <button type="button" onClick={() => act('restore')} disabled={busy} className={`${button} mt-4 bg-accent-700 text-white enabled:hover:bg-accent-900`}>
          Restore this extract
        </button>
      </>
    );
  } else if (extract.status === 'failed') {
    body = (
      <>
        <p className="text-sm text-ink-700">{extract.problem?.message ?? 'Processing failed.'} Nothing from this file is visible.</p>
        <div className="mt-4 flex gap-3">
          <button type="button" onClick={() => act('retry')} disabled={busy} className={`${button} bg-accent-700 text-white enabled:hover:bg-accent-900`}>
            Try again
          </button>
          {extract.decided === null ? (
            <button type="button" onClick={() => act('reject')} disabled={busy} className={`${button} border border-ink-300 bg-panel text-ink-900`}>
              Reject this file
            </button>
          ) : null}
        </div>
      </>
    );
  } else if (extract.status === 'accepted') {
    body = <p className="text-sm text-ink-700">These rows are this month’s data. The next recompute uses them.</p>;
  } else if (extract.status === 'rejected') {
    body = <p className="text-sm text-ink-700">Nothing from this file is stored beyond this record and its report.{extract.decisionNote ? ` Note: ${extract.decisionNote}` : ''}</p>;
  }
  if (!body) return null;
  return (
    <section aria-labelledby="decision-heading" className="rounded-lg border border-rule bg-panel p-6">
      <h2 id="decision-heading" className="text-lg font-semibold text-ink-900">
        Decision
      </h2>
      <div className="mt-3">{body}</div>
      {decide.isError ? (
        <p role="alert" className="mt-4 rounded-md border-l-4 border-serious bg-serious-50 px-4 py-3 text-sm text-ink-700">
          {decide.error.message}
        </p>
      ) : null}
    </section>
  );
}
