import type { ExtractProgressDto } from '@shared/api/extracts';
import type { ExtractStatus } from '@shared/schemas/extract';
import { ProgressBar } from '@/components/ui/progress-bar';

/** Status words for analysts; never colour alone (each badge carries its word). */
export const STATUS_LABELS: Record<ExtractStatus, string> = {
  uploaded: 'Needs column mapping',
  validating: 'Checking',
  'awaiting-decision': 'Waiting for decision',
  loading: 'Loading',
  accepted: 'Accepted',
  rejected: 'Rejected',
  failed: 'Failed',
  superseded: 'Superseded',
};

const STYLES: Record<ExtractStatus, string> = {
  uploaded: 'border-caution bg-caution-50 text-ink-900',
  validating: 'border-accent-500 bg-accent-50 text-accent-900',
  'awaiting-decision': 'border-caution bg-caution-50 text-ink-900',
  loading: 'border-accent-500 bg-accent-50 text-accent-900',
  accepted: 'border-accent-700 bg-accent-100 text-accent-900',
  rejected: 'border-ink-300 bg-panel text-ink-700',
  failed: 'border-serious bg-serious-50 text-ink-900',
  superseded: 'border-dashed border-ink-300 bg-panel text-ink-500',
};

export function StatusBadge({ status }: { status: ExtractStatus }) {
  return <span className={`inline-block whitespace-nowrap rounded border px-2 py-0.5 text-xs font-medium ${STYLES[status]}`}>{STATUS_LABELS[status]}</span>;
}

const PHASE_LABELS: Record<ExtractProgressDto['phase'], string> = {
  validating: 'Checking every row',
  loading: 'Loading into the database',
  publishing: 'Making the rows visible',
};

/** The server's progress on an extract, as a bar. */
export function ServerProgress({ progress }: { progress: ExtractProgressDto }) {
  const detail =
    progress.unit === 'bytes'
      ? `${formatBytes(progress.done)} of ${formatBytes(progress.total)} read`
      : `${progress.done.toLocaleString()} of ${progress.total.toLocaleString()} rows`;
  return <ProgressBar label={PHASE_LABELS[progress.phase]} done={progress.phase === 'publishing' ? 0 : progress.done} total={progress.phase === 'publishing' ? 0 : progress.total} detail={detail} />;
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}
