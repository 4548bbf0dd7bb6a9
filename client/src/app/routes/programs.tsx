import { CautionBanner } from '@/components/ui/caution-banner';
import { PageHeader } from '@/components/ui/page-header';
import { ProgramList } from '@/features/programs/components/program-list';

export default function ProgramsRoute() {
  return (
    <>
      <PageHeader title="Programs" lead="Each program rations help by a score cutoff. Cutline follows, month by month, what the help does for the people it reaches." />
      <CautionBanner />
      <ProgramList />
    </>
  );
}
