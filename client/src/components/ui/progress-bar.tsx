/**
 * A labelled progress bar (role="progressbar" with its value), for long work: a file's transfer,
 * then the server's checking and loading. `total` 0 shows an indeterminate bar.
 */
export function ProgressBar({ label, done, total, detail }: { label: string; done: number; total: number; detail?: string }) {
  const share = total > 0 ? Math.min(1, done / total) : null;
  return (
    <div className="w-full">
      <div className="flex items-baseline justify-between text-sm">
        <span className="font-medium text-ink-900">{label}</span>
        <span className="figures text-ink-500">{share === null ? 'working…' : `${Math.round(share * 100)}%`}</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={share === null ? undefined : Math.round(share * 100)}
        className="mt-1.5 h-2 overflow-hidden rounded-full bg-accent-50"
      >
        <div
          className={`h-full rounded-full bg-accent-500 transition-[width] duration-300 ${share === null ? 'w-1/3 animate-pulse' : ''}`}
          style={share === null ? undefined : { width: `${share * 100}%` }}
        />
      </div>
      {detail ? <p className="figures mt-1 text-xs text-ink-500">{detail}</p> : null}
    </div>
  );
}
