import { useState } from 'react';
import { can } from '@shared/policy';
import { mailAttachmentUrl, useMailMessage, useMailOutbox } from '../api/admin';
import { useSessionUser } from '../api/auth';
import { Button } from '../components/Button';
import { NotAllowed } from '../components/NotAllowed';
import { ErrorNotice, LoadingNotice, EmptyState } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { formatDateTime } from '../lib/format';
import { cn } from '../lib/cn';
import { usePageTitle } from '../lib/usePageTitle';

const kb = (n: number) => (n < 1024 ? `${n} B` : `${(n / 1024).toFixed(n < 10240 ? 1 : 0)} KB`);

/** `/admin/mail` — what the product sent (as captured by the local mail fake), with attachments. */
export default function AdminMailPage() {
  usePageTitle('Mail outbox');
  const user = useSessionUser();
  if (!can(user.role, 'mail.read')) return <NotAllowed />;
  return <Outbox />;
}

function Outbox() {
  const [page, setPage] = useState(1);
  const [open, setOpen] = useState<number | null>(null);
  const list = useMailOutbox(page);
  const msg = useMailMessage(open);
  const pages = list.data ? Math.max(1, Math.ceil(list.data.total / list.data.pageSize)) : 1;
  return (
    <>
      <PageHeader title="Mail outbox" lead="Messages the product sent: review notices, released plan sheets, invitations." />
      {list.isPending ? (
        <LoadingNotice label="Loading mail…" />
      ) : list.isError ? (
        <ErrorNotice error={list.error} />
      ) : list.data.messages.length === 0 ? (
        <EmptyState title="No mail sent yet." />
      ) : (
        <div className="grid grid-cols-[minmax(0,1fr)_minmax(0,1fr)] gap-4">
          <div>
            <ul aria-label="Messages" className="flex flex-col divide-y divide-rule rounded-control border border-rule bg-paper-raised">
              {list.data.messages.map((m) => (
                <li key={m.id}>
                  <button type="button" onClick={() => setOpen(m.id)} className={cn('flex w-full flex-col gap-0.5 px-3 py-2 text-left text-sm hover:bg-paper', open === m.id && 'bg-accent-wash')}>
                    <span className="font-bold">{m.subject || '(no subject)'}</span>
                    <span className="text-xs text-ink-muted">to {m.to.join(', ')} · {formatDateTime(m.at)}</span>
                    {m.attachments.length > 0 && <span className="text-xs text-ink-muted">{m.attachments.map((a) => `${a.filename} (${kb(a.size)})`).join(', ')}</span>}
                  </button>
                </li>
              ))}
            </ul>
            <div className="mt-3 flex items-center gap-3 text-sm">
              <Button size="sm" disabled={page <= 1} onClick={() => setPage(page - 1)}>Newer</Button>
              <span>Page {page} of {pages}</span>
              <Button size="sm" disabled={page >= pages} onClick={() => setPage(page + 1)}>Older</Button>
            </div>
          </div>
          <div className="rounded-control border border-rule bg-paper-raised p-3">
            {open === null ? (
              <p className="text-sm text-ink-muted">Choose a message to read it.</p>
            ) : msg.isPending ? (
              <LoadingNotice />
            ) : msg.isError ? (
              <ErrorNotice error={msg.error} />
            ) : (
              <article aria-label="Message">
                <h2 className="font-bold">{msg.data.subject}</h2>
                <p className="text-xs text-ink-muted">from {msg.data.from} · to {msg.data.to.join(', ')} · {formatDateTime(msg.data.at)}</p>
                <pre className="mt-3 text-sm whitespace-pre-wrap font-sans">{msg.data.text}</pre>
                {msg.data.attachments.length > 0 && (
                  <ul className="mt-3 flex flex-col gap-1 text-sm">
                    {msg.data.attachments.map((a, i) => (
                      <li key={i}>
                        <a href={mailAttachmentUrl(msg.data.id, i)} className="font-bold text-accent underline underline-offset-4">{a.filename}</a> <span className="text-ink-muted">({kb(a.size)}, {a.contentType})</span>
                      </li>
                    ))}
                  </ul>
                )}
              </article>
            )}
          </div>
        </div>
      )}
    </>
  );
}
