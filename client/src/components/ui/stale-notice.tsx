import { formatDateTime } from '@/lib/format';
import type { RunDto } from '@shared/api/runs';

/** Says when results are being recomputed, failed to refresh, or are out of date, in plain words. */
export function StaleNotice({ stale, lastRun, timeZone, reason }: { stale: boolean; lastRun: RunDto | null; timeZone?: string; reason?: string | null }) {
  const running = lastRun && (lastRun.status === 'queued' || lastRun.status === 'running');
  if (!stale && !running) return null;
  const text = running
    ? `A recompute is under way (${lastRun.progress.done} of ${lastRun.progress.total || '…'} parts done); the figures below are the previous ones until it finishes.`
    : lastRun?.status === 'failed'
      ? `The last recompute failed (${formatDateTime(lastRun.finishedAt, timeZone)}); the figures below are the previous ones and may be out of date.`
      : `Some figures below are out of date${reason ? `: ${reason}` : ''}. They are replaced at the next recompute.`;
  return (
    <p role="status" className="mb-6 rounded-md border border-dashed border-caution bg-caution-50 px-4 py-2 text-sm text-ink-900">
      <strong className="font-medium">Out of date.</strong> {text}
    </p>
  );
}
