import { useState } from 'react';
import { Link } from 'react-router-dom';
import { DataTable } from '@/components/ui/data-table';
import { Pager } from '@/components/ui/pager';
import { Empty, ErrorState, Loading } from '@/components/ui/states';
import { formatDateTime } from '@/lib/format';
import { useSentMail, useSentMessage } from '../api/mail';
import { buttonPrimary, buttonSecondary, panel } from '@/components/ui/styles';

export function SentMailList() {
  const [page, setPage] = useState(1);
  const mail = useSentMail(page);
  if (mail.isPending) return <Loading label="Loading sent mail…" />;
  if (mail.isError) return <ErrorState error={mail.error} onRetry={() => void mail.refetch()} />;
  if (mail.data.items.length === 0) return <Empty title="No e-mail sent yet">Directors’ summaries appear here once their schedule comes round.</Empty>;
  return (
    <>
      <DataTable
        label="Sent mail"
        rows={mail.data.items}
        rowKey={(m) => m.id}
        columns={[
          { header: 'Sent', cell: ({ row }) => formatDateTime(row.original.sentAt) },
          { header: 'To', cell: ({ row }) => row.original.to },
          { header: 'Subject', cell: ({ row }) => <Link className="text-accent-700 underline" to={`/admin/mail/${row.original.id}`}>{row.original.subject}</Link> },
          { header: 'Status', cell: ({ row }) => (row.original.status === 'sent' ? 'Sent' : <span className="text-serious">Not accepted: {row.original.error}</span>) },
          { header: 'Local copy', cell: ({ row }) => (row.original.hasLocalCopy ? '.eml kept' : '—') },
        ]}
      />
      <Pager label="Pages" page={mail.data.page} pageSize={mail.data.pageSize} total={mail.data.total} onPage={setPage} />
    </>
  );
}

export function SentMessage({ id }: { id: number }) {
  const msg = useSentMessage(id);
  const [view, setView] = useState<'html' | 'text' | 'raw'>('html');
  if (msg.isPending) return <Loading label="Loading the message…" />;
  if (msg.isError) return <ErrorState error={msg.error} onRetry={() => void msg.refetch()} />;
  const m = msg.data;
  return (
    <div className="grid gap-4">
      <dl className={`${panel} grid gap-1 text-sm`}>
        <div><dt className="inline text-ink-500">To: </dt><dd className="inline">{m.to}</dd></div>
        <div><dt className="inline text-ink-500">Subject: </dt><dd className="inline font-medium">{m.subject}</dd></div>
        <div><dt className="inline text-ink-500">Sent: </dt><dd className="inline">{formatDateTime(m.sentAt)}</dd></div>
        <div><dt className="inline text-ink-500">Message-ID: </dt><dd className="inline font-mono text-xs">{m.messageId}</dd></div>
      </dl>
      <div className="flex gap-2" role="tablist" aria-label="Message parts">
        {(['html', 'text', 'raw'] as const).map((v) => (
          <button key={v} type="button" role="tab" aria-selected={view === v} className={view === v ? buttonPrimary : buttonSecondary} onClick={() => setView(v)} disabled={v === 'raw' && !m.raw}>
            {v === 'html' ? 'As the reader sees it' : v === 'text' ? 'Plain text' : 'Source (.eml)'}
          </button>
        ))}
      </div>
      {view === 'html' ? (
        // sandbox="" runs no script and opens nothing; inline images (cid:) show only in a mail client.
        <iframe title="Message as HTML" sandbox="" srcDoc={m.html} className="h-[720px] w-full rounded-lg border border-rule bg-white" />
      ) : null}
      {view === 'text' ? <pre className={`${panel} overflow-x-auto whitespace-pre-wrap text-sm`}>{m.text}</pre> : null}
      {view === 'raw' && m.raw ? <pre className={`${panel} max-h-[720px] overflow-auto text-xs`}>{m.raw}</pre> : null}
    </div>
  );
}
