import { useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { DesignListPage } from '@/features/designs/components/design-pages';

export default function DesignsRoute() {
  const programId = Number(useParams().programId);
  return (
    <>
      <PageHeader title="Evaluation designs" lead="The analysis settings behind every result. An edit writes a new version; a locked design records every later change as a deviation with its reason." />
      <DesignListPage programId={programId} />
    </>
  );
}
