import { useParams } from 'react-router-dom';
import { CautionBanner } from '@/components/ui/caution-banner';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, Loading } from '@/components/ui/states';
import { AnnexDownloads } from '@/features/annex/components/annex-downloads';
import { ProgramNav } from '@/features/programs/components/program-nav';
import { useProgram } from '@/features/programs/api/get-program';
import { useResultsOverview } from '@/features/results/api/get-results-overview';
import { TrendDashboard } from '@/features/trends/components/trend-dashboard';

/** `/programs/:programId`: the cohort trend dashboard (the manager's main screen). */
export default function ProgramTrendsRoute() {
  const programId = Number(useParams().programId);
  const program = useProgram(programId);
  const overview = useResultsOverview(programId);
  if (program.isPending || overview.isPending) return <Loading label="Loading the program’s results…" />;
  if (program.isError) return <ErrorState error={program.error} onRetry={() => void program.refetch()} />;
  if (overview.isError) return <ErrorState error={overview.error} onRetry={() => void overview.refetch()} />;
  return (
    <>
      <PageHeader title={program.data.name} lead="What qualifying changes, month by month, for the people near the cutoff." actions={<AnnexDownloads programId={programId} />} />
      <ProgramNav program={program.data} />
      <CautionBanner />
      <TrendDashboard program={program.data} overview={overview.data} />
    </>
  );
}
