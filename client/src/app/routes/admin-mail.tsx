import { PageHeader } from '@/components/ui/page-header';
import { SentMailList } from '@/features/mail/components/sent-mail';

export default function AdminMailRoute() {
  return (
    <>
      <PageHeader title="Sent mail" lead="Every message Cutline sent or tried to send. In development and tests the local mail server keeps a copy of each (.eml)." />
      <SentMailList />
    </>
  );
}
