import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, Loading } from '@/components/ui/states';
import { useExtract } from '@/features/extracts/api/get-extract';
import { useDataSources } from '@/features/extracts/api/get-data-sources';
import { ExtractDecision } from '@/features/extracts/components/extract-decision';
import { ExtractReport } from '@/features/extracts/components/extract-report';
import { ServerProgress, StatusBadge, formatBytes } from '@/features/extracts/components/extract-status';
import { MappingForm } from '@/features/extracts/components/mapping-form';
import { useProgram } from '@/features/programs/api/get-program';
import { formatDateTime, formatPeriod } from '@/lib/format';

/** `/programs/:programId/extracts/:extractId`: progress, column mapping, report and decision. */
export default function ExtractRoute() {
  const params = useParams();
  const programId = Number(params.programId);
  const extractId = Number(params.extractId);
  const program = useProgram(programId);
  const extract = useExtract(programId, extractId);
  const sources = useDataSources(programId);
  const [remapping, setRemapping] = useState(false);
  if (program.isPending || extract.isPending || sources.isPending) return <Loading label="Loading the extract…" />;
  const failed = [program, extract, sources].find((q) => q.isError);
  if (failed?.isError) return <ErrorState error={failed.error} onRetry={() => void failed.refetch()} />;
  const p = program.data!;
  const e = extract.data!;
  const showMapping = e.status === 'uploaded' || (remapping && e.canRemap);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to={`/programs/${programId}/extracts`} className="text-accent-700 underline underline-offset-4">
          {p.name}: extracts
        </Link>
      </p>
      <PageHeader
        title={`${formatPeriod(e.period)} extract`}
        lead={
          <span className="text-sm">
            <span className="break-all">{e.fileName}</span> · {formatBytes(e.byteSize)} · uploaded {formatDateTime(e.uploaded.at, p.timeZone)} by {e.uploaded.by}
            {e.source ? ` · ${e.source.name}` : ''}
            <span className="mt-1 block font-mono text-xs text-ink-500">SHA-256 {e.sha256}</span>
          </span>
        }
        actions={<StatusBadge status={e.status} />}
      />
      <div className="grid gap-6">
        {e.progress ? (
          <div className="rounded-lg border border-rule bg-panel p-6" aria-live="polite">
            <ServerProgress progress={e.progress} />
          </div>
        ) : null}
        {showMapping ? (
          <MappingForm extract={e} program={p} sources={sources.data!} onDone={() => setRemapping(false)} />
        ) : null}
        {e.status !== 'uploaded' && (e.report || e.problem) ? <ExtractReport extract={e} programId={programId} /> : null}
        {e.canRemap && e.status === 'awaiting-decision' && !remapping ? (
          <p className="text-sm">
            <button type="button" onClick={() => setRemapping(true)} className="text-accent-700 underline underline-offset-4">
              Change the column mapping and check again
            </button>
          </p>
        ) : null}
        <ExtractDecision extract={e} programId={programId} timeZone={p.timeZone} />
      </div>
    </>
  );
}
