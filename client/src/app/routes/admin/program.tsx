import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, Loading } from '@/components/ui/states';
import { useProgram } from '@/features/programs/api/get-program';
import { ProgramSettings } from '@/features/program-admin/components/program-settings';

/** `/admin/programs/:programId`: for the program's administrators (the server checks each save). */
export default function AdminProgramRoute() {
  const programId = Number(useParams().programId);
  const program = useProgram(programId);
  if (program.isPending) return <Loading label="Loading the program…" />;
  if (program.isError) return <ErrorState error={program.error} onRetry={() => void program.refetch()} />;
  return (
    <>
      <PageHeader
        title={`${program.data.name}: settings`}
        lead={
          <Link to={`/programs/${programId}`} className="text-accent-700 underline underline-offset-2">
            Open the program’s trends
          </Link>
        }
      />
      <ProgramSettings program={program.data} />
    </>
  );
}
