import { useState } from 'react';
import { buttonSecondary } from '@/components/ui/styles';
import { downloadFile } from '../api/download-file';

type State = { kind: 'idle' } | { kind: 'working' } | { kind: 'done'; name: string } | { kind: 'failed'; message: string };

/**
 * A button that builds a file on the server and saves it, saying what it is doing: preparing,
 * saved (with the file name), or what went wrong in the server's own words.
 */
export function DownloadButton({ path, fallbackName, label, workingLabel }: { path: string; fallbackName: string; label: string; workingLabel: string }) {
  const [state, setState] = useState<State>({ kind: 'idle' });
  const start = async () => {
    setState({ kind: 'working' });
    try {
      setState({ kind: 'done', name: await downloadFile(path, fallbackName) });
    } catch (err) {
      setState({ kind: 'failed', message: err instanceof Error ? err.message : 'The download failed. Please try again.' });
    }
  };
  return (
    <span className="inline-flex flex-col items-start gap-1">
      <button type="button" className={buttonSecondary} disabled={state.kind === 'working'} onClick={() => void start()}>
        {state.kind === 'working' ? workingLabel : label}
      </button>
      <span role="status" aria-live="polite" className="text-xs text-ink-500">
        {state.kind === 'done' ? `Saved ${state.name}.` : null}
      </span>
      {state.kind === 'failed' ? (
        <span role="alert" className="max-w-sm text-xs text-serious">
          {state.message}
        </span>
      ) : null}
    </span>
  );
}
