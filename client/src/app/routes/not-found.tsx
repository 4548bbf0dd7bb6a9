import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';

export default function NotFoundRoute() {
  return (
    <>
      <PageHeader title="Page not found" lead="The address may be mistyped, or the page may have moved." />
      <Link to="/" className="text-accent-700 underline underline-offset-4">
        Back to programs
      </Link>
    </>
  );
}
