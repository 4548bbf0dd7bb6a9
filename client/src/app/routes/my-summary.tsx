import { PageHeader } from '@/components/ui/page-header';
import { SummarySettings } from '@/features/summary/components/summary-settings';

export default function MySummaryRoute() {
  return (
    <>
      <PageHeader title="My summary e-mail" lead="A short summary of the latest months of your programs, by e-mail. Choose when it comes, which programs it covers, or pause it." />
      <SummarySettings />
    </>
  );
}
