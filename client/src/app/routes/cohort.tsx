import { Link, useParams } from 'react-router-dom';
import { CautionBanner } from '@/components/ui/caution-banner';
import { PageHeader } from '@/components/ui/page-header';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { AnnexDownloads } from '@/features/annex/components/annex-downloads';
import { useCohortDetail } from '@/features/cohort/api/get-cohort-detail';
import { CohortDetail } from '@/features/cohort/components/cohort-detail';
import { useProgram } from '@/features/programs/api/get-program';
import { ApiError } from '@/lib/api-client';
import { formatPeriod } from '@/lib/format';

/** `/programs/:programId/cohorts/:period`: one month in full. */
export default function CohortRoute() {
  const params = useParams();
  const programId = Number(params.programId);
  const period = params.period ?? '';
  const program = useProgram(programId);
  const detail = useCohortDetail(programId, period);
  const title = `${formatPeriod(period, undefined, true)}`;
  const back = (
    <Link to={`/programs/${programId}`} className="text-accent-700 underline underline-offset-2">
      {program.data?.name ?? 'The program'}: all months
    </Link>
  );
  if (program.isPending || detail.isPending) return <Loading label={`Loading ${title}…`} />;
  if (program.isError) return <ErrorState error={program.error} onRetry={() => void program.refetch()} />;
  if (detail.isError) {
    if (detail.error instanceof ApiError && detail.error.code === 'result_not_found') {
      return (
        <>
          <PageHeader title={title} lead={back} />
          <Empty title="No results for this month yet">{detail.error.message}</Empty>
        </>
      );
    }
    return <ErrorState error={detail.error} onRetry={() => void detail.refetch()} />;
  }
  return (
    <>
      <PageHeader
        title={`${program.data.name}: ${title}`}
        lead={back}
        actions={
          <>
            <AnnexDownloads programId={programId} period={period} />
            <PrintButton />
          </>
        }
      />
      <CautionBanner />
      <CohortDetail program={program.data} detail={detail.data} />
    </>
  );
}

function PrintButton() {
  return (
    <button type="button" onClick={() => window.print()} className="rounded border border-ink-300 bg-panel px-3 py-1.5 text-sm text-ink-900 hover:border-ink-500">
      Print this month
    </button>
  );
}
