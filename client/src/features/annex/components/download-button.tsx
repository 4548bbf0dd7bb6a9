import { useEffect, useState } from 'react';
import { buttonSecondary } from '@/components/ui/styles';
import { downloadFile } from '../api/download-file';

type State = { kind: 'idle' } | { kind: 'working' } | { kind: 'done'; name: string } | { kind: 'failed'; message: string };

/** How long the "saved" notice stays, milliseconds (an error stays until closed). */
const DONE_NOTICE_MS = 8_000;
/** Sent when any download starts, so only one notice shows at a time. */
const STARTED_EVENT = 'cutline:download-started';

/**
 * A button that builds a file on the server and saves it, saying what it is doing: preparing (on
 * the button), then a notice in the corner of the window with the file saved, or what went wrong
 * in the server's own words. The notice floats, so the page's header keeps its layout.
 */
export function DownloadButton({ path, fallbackName, label, workingLabel }: { path: string; fallbackName: string; label: string; workingLabel: string }) {
  const [state, setState] = useState<State>({ kind: 'idle' });
  useEffect(() => {
    if (state.kind !== 'done') return;
    const timer = window.setTimeout(() => setState({ kind: 'idle' }), DONE_NOTICE_MS);
    return () => window.clearTimeout(timer);
  }, [state]);
  useEffect(() => {
    const clear = () => setState((s) => (s.kind === 'done' || s.kind === 'failed' ? { kind: 'idle' } : s));
    window.addEventListener(STARTED_EVENT, clear);
    return () => window.removeEventListener(STARTED_EVENT, clear);
  }, []);
  const start = async () => {
    window.dispatchEvent(new Event(STARTED_EVENT));
    setState({ kind: 'working' });
    try {
      setState({ kind: 'done', name: await downloadFile(path, fallbackName) });
    } catch (err) {
      setState({ kind: 'failed', message: err instanceof Error ? err.message : 'The download failed. Please try again.' });
    }
  };
  const notice = 'fixed right-6 bottom-6 z-20 max-w-md rounded-md border bg-panel px-4 py-3 text-sm shadow-lg';
  return (
    <>
      <button type="button" className={buttonSecondary} disabled={state.kind === 'working'} aria-busy={state.kind === 'working'} onClick={() => void start()}>
        {state.kind === 'working' ? workingLabel : label}
      </button>
      <span role="status" aria-live="polite" className={state.kind === 'done' ? `${notice} border-rule text-ink-700` : 'sr-only'}>
        {state.kind === 'done' ? `Saved ${state.name}.` : ''}
      </span>
      {state.kind === 'failed' ? (
        <span role="alert" className={`${notice} border-serious text-ink-900`}>
          <span className="font-medium">The download did not work.</span> {state.message}
          <button type="button" className="ml-3 text-accent-700 underline" onClick={() => setState({ kind: 'idle' })}>
            Close
          </button>
        </span>
      ) : null}
    </>
  );
}
