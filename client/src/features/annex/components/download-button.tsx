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
    // The status line hangs below the button, so it never stretches the buttons beside it.
    <span className="relative inline-flex">
      <button type="button" className={buttonSecondary} disabled={state.kind === 'working'} onClick={() => void start()}>
        {state.kind === 'working' ? workingLabel : label}
      </button>
      <span role="status" aria-live="polite" className="absolute top-full right-0 mt-1 text-xs whitespace-nowrap text-ink-500">
        {state.kind === 'done' ? `Saved ${state.name}.` : null}
      </span>
      {state.kind === 'failed' ? (
        <span role="alert" className="absolute top-full right-0 z-10 mt-1 w-80 rounded border border-serious bg-panel p-2 text-xs text-serious shadow">
          {state.message}
        </span>
      ) : null}
    </span>
  );
}
