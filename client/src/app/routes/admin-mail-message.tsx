import { Link, useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { SentMessage } from '@/features/mail/components/sent-mail';

export default function AdminMailMessageRoute() {
  const id = Number(useParams().messageId);
  return (
    <>
      <PageHeader title="Sent message" lead={<Link className="text-accent-700 underline" to="/admin/mail">All sent mail</Link>} />
      <SentMessage id={id} />
    </>
  );
}
