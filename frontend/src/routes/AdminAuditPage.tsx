import { useState, type FormEvent } from 'react';
import { auditActionGroups, auditKindOptions } from '@shared/audit';
import { can } from '@shared/policy';
import { useAudit, type AuditFilter } from '../api/admin';
import { useSessionUser } from '../api/auth';
import { useUsers } from '../api/users';
import { Button } from '../components/Button';
import { NotAllowed } from '../components/NotAllowed';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { formatDateTime } from '../lib/format';
import { usePageTitle } from '../lib/usePageTitle';

const ACTION_GROUPS = auditActionGroups();
const KIND_OPTIONS = auditKindOptions();
const inputCls = 'h-9 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm';

/** `/admin/audit` — who did what and when, filtered and paged. */
export default function AdminAuditPage() {
  usePageTitle('Audit log');
  const user = useSessionUser();
  if (!can(user.role, 'audit.read')) return <NotAllowed />;
  return <AuditBrowser />;
}

function AuditBrowser() {
  const [filter, setFilter] = useState<AuditFilter>({ page: 1 });
  const [draft, setDraft] = useState<Omit<AuditFilter, 'page'>>({});
  const users = useUsers();
  const audit = useAudit(filter);
  function apply(e: FormEvent) {
    e.preventDefault();
    setFilter({ ...draft, from: draft.from ? new Date(draft.from).toISOString() : undefined, to: draft.to ? new Date(draft.to).toISOString() : undefined, page: 1 });
  }
  const pages = audit.data ? Math.max(1, Math.ceil(audit.data.total / audit.data.pageSize)) : 1;
  return (
    <>
      <PageHeader title="Audit log" lead="Every submission, decision, comment, release, invitation and edit, newest first." />
      <form onSubmit={apply} className="mb-4 flex flex-wrap items-end gap-3" aria-label="Filter the audit log">
        <label className="flex flex-col gap-1 text-xs font-bold">
          Action
          <select className={inputCls} value={draft.action ?? ''} onChange={(e) => setDraft({ ...draft, action: e.target.value || undefined })}>
            <option value="">Any</option>
            {ACTION_GROUPS.map((g) => (
              <optgroup key={g.label} label={g.label}>
                {g.options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
              </optgroup>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          Person
          <select className={inputCls} value={draft.actor ?? ''} onChange={(e) => setDraft({ ...draft, actor: e.target.value || undefined })}>
            <option value="">Anyone</option>
            {users.data?.map((u) => <option key={u.id} value={u.id}>{u.name}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          Item kind
          <select className={inputCls} value={draft.entity ?? ''} onChange={(e) => setDraft({ ...draft, entity: e.target.value || undefined })}>
            <option value="">Any</option>
            {KIND_OPTIONS.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          From
          <input type="datetime-local" className={inputCls} value={draft.from ?? ''} onChange={(e) => setDraft({ ...draft, from: e.target.value || undefined })} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          To
          <input type="datetime-local" className={inputCls} value={draft.to ?? ''} onChange={(e) => setDraft({ ...draft, to: e.target.value || undefined })} />
        </label>
        <Button type="submit">Show</Button>
      </form>
      {audit.isPending ? (
        <LoadingNotice label="Loading the audit log…" />
      ) : audit.isError ? (
        <ErrorNotice error={audit.error} />
      ) : (
        <>
          <table aria-label="Audit events" className="w-full border-collapse rounded-control border border-rule bg-paper-raised text-sm">
            <thead>
              <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
                <th scope="col" className="px-3 py-2">When</th>
                <th scope="col" className="px-3 py-2">Who</th>
                <th scope="col" className="px-3 py-2">Action</th>
                <th scope="col" className="px-3 py-2">Item</th>
                <th scope="col" className="px-3 py-2">Details</th>
              </tr>
            </thead>
            <tbody>
              {audit.data.events.map((e) => (
                <tr key={e.id} className="border-b border-rule align-top last:border-b-0">
                  <td className="px-3 py-1.5 whitespace-nowrap text-ink-muted">{formatDateTime(e.at)}</td>
                  <td className="px-3 py-1.5">{e.actor?.name ?? '—'}</td>
                  <td className="px-3 py-1.5">{e.words.action}</td>
                  <td className="px-3 py-1.5">
                    <span className="block text-xs text-ink-muted">{e.words.kind}</span>
                    {e.words.item && <span className="block">{e.words.item}</span>}
                  </td>
                  <td className="max-w-md px-3 py-1.5 text-xs text-ink-muted">
                    {e.words.details.length > 0 ? (
                      <ul className="flex flex-col gap-0.5" aria-label="Changes">
                        {e.words.details.map((d, i) => <li key={i}>{d}</li>)}
                      </ul>
                    ) : (
                      '—'
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="mt-3 flex items-center gap-3 text-sm">
            <Button size="sm" disabled={filter.page <= 1} onClick={() => setFilter({ ...filter, page: filter.page - 1 })}>Newer</Button>
            <span>Page {filter.page} of {pages} · {audit.data.total} events</span>
            <Button size="sm" disabled={filter.page >= pages} onClick={() => setFilter({ ...filter, page: filter.page + 1 })}>Older</Button>
          </div>
        </>
      )}
    </>
  );
}
