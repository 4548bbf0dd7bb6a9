import { Link, useParams } from 'react-router-dom';
import { DEMO_PROGRAM } from '@shared/demo/heating-credit';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, Loading } from '@/components/ui/states';
import { useDataSources, useIngestSettings } from '@/features/extracts/api/get-data-sources';
import { ExtractsTable } from '@/features/extracts/components/extracts-table';
import { UploadPanel } from '@/features/extracts/components/upload-panel';
import { useProgram } from '@/features/programs/api/get-program';
import { formatShare } from '@/lib/format';

/** `/programs/:programId/extracts`: upload a month's file and see every extract with its status. */
export default function ExtractsRoute() {
  const programId = Number(useParams().programId);
  const program = useProgram(programId);
  const sources = useDataSources(programId);
  const settings = useIngestSettings(programId);
  if (program.isPending || sources.isPending) return <Loading label="Loading the program…" />;
  if (program.isError) return <ErrorState error={program.error} onRetry={() => void program.refetch()} />;
  if (sources.isError) return <ErrorState error={sources.error} onRetry={() => void sources.refetch()} />;
  const isDemo = program.data.slug === DEMO_PROGRAM.slug;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link to="/" className="text-accent-700 underline underline-offset-4">
          Programs
        </Link>{' '}
        / {program.data.name}
      </p>
      <PageHeader
        title="Monthly extracts"
        lead={
          <>
            Each month’s administrative file, from upload to decision.
            {settings.data
              ? ` This program accepts a file with up to ${formatShare(settings.data.maxRejectedShare, 0)} rejected rows and keeps row-level data for ${settings.data.retentionMonths} months.`
              : ''}
          </>
        }
      />
      <UploadPanel programId={programId} sources={sources.data} sampleHref={isDemo ? `/api/programs/${programId}/sample-extract.xlsx` : undefined} />
      <ExtractsTable programId={programId} timeZone={program.data.timeZone} />
    </>
  );
}
