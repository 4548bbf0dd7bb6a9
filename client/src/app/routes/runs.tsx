import { useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { RunLog } from '@/features/runs/components/run-log';

export default function RunsRoute() {
  const programId = Number(useParams().programId);
  return (
    <>
      <PageHeader title="Recompute runs" lead="Estimates follow the data: a recompute runs when an extract is accepted or a design changes, nightly for anything stale, or when you ask. A failed run keeps the previous results (marked stale) and retries by itself." />
      <RunLog programId={programId} />
    </>
  );
}
