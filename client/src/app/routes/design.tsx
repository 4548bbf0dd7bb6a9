import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { DesignDetailPage } from '@/features/designs/components/design-pages';
import { useDesign } from '@/features/designs/api/designs';

export default function DesignRoute() {
  const params = useParams();
  const programId = Number(params.programId);
  const designId = Number(params.designId);
  const design = useDesign(programId, designId);
  return (
    <>
      <PageHeader
        title={design.data?.name ?? 'Evaluation design'}
        lead={<Link className="text-accent-700 underline" to={`/programs/${programId}/designs`}>All designs of this program</Link>}
      />
      <DesignDetailPage programId={programId} designId={designId} />
    </>
  );
}
