import { useState, type FormEvent } from 'react';
import { can } from '@shared/policy';
import { ROLES, type Role } from '@shared/schemas/user';
import { useSessionUser } from '../api/auth';
import { useCreateInvitation, useInvitations, useRevokeInvitation } from '../api/invitations';
import { useProjects } from '../api/projects';
import { Button } from '../components/Button';
import { NotAllowed } from '../components/NotAllowed';
import { EmptyState, ErrorNotice, LoadingNotice, StatusNote } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { ROLE_LABEL, RoleBadge } from '../components/RoleBadge';
import { formatDateTime } from '../lib/format';
import { usePageTitle } from '../lib/usePageTitle';

const inputCls = 'h-9 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm';

/** `/admin/invitations` — invite people by e-mail with a role (clients to a project); pending invitations; withdraw. */
export default function InvitePeoplePage() {
  usePageTitle('Invitations');
  const user = useSessionUser();
  if (!can(user.role, 'invite.manage')) return <NotAllowed />;
  return <Invitations />;
}

function Invitations() {
  const list = useInvitations();
  const projects = useProjects();
  const create = useCreateInvitation();
  const revoke = useRevokeInvitation();
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('client');
  const [projectId, setProjectId] = useState('');
  const [sent, setSent] = useState<string | null>(null);

  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    setSent(null);
    const res = await create.mutateAsync({ email, role, projectId: role === 'client' && projectId ? Number(projectId) : null }).catch(() => null);
    if (res) {
      setSent(res.mail.status === 'sent' ? `Invitation sent to ${res.invitation.email}.` : `Invitation created, but the mail failed: ${res.mail.error ?? 'unknown error'}.`);
      setEmail('');
    }
  }

  return (
    <>
      <PageHeader title="Invitations" lead="Invite a person by e-mail. The link works once and expires after 72 hours." />
      <form onSubmit={onSubmit} className="mb-6 flex flex-wrap items-end gap-3 rounded-control border border-rule bg-paper-raised p-3" aria-label="Invite a person">
        <label className="flex flex-col gap-1 text-xs font-bold">
          E-mail
          <input type="email" required className={`${inputCls} w-72`} value={email} onChange={(e) => setEmail(e.target.value)} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-bold">
          Role
          <select className={inputCls} value={role} onChange={(e) => setRole(e.target.value as Role)}>
            {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABEL[r]}</option>)}
          </select>
        </label>
        {role === 'client' && (
          <label className="flex flex-col gap-1 text-xs font-bold">
            Project
            <select className={inputCls} required value={projectId} onChange={(e) => setProjectId(e.target.value)}>
              <option value="">Choose…</option>
              {projects.data?.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
            </select>
          </label>
        )}
        <Button type="submit" variant="primary" busy={create.isPending}>Send invitation</Button>
      </form>
      {create.isError && <ErrorNotice error={create.error} className="mb-4" />}
      {sent && <div className="mb-4"><StatusNote>{sent}</StatusNote></div>}
      {list.isPending ? (
        <LoadingNotice />
      ) : list.isError ? (
        <ErrorNotice error={list.error} />
      ) : list.data.length === 0 ? (
        <EmptyState title="No pending invitations." />
      ) : (
        <table aria-label="Pending invitations" className="w-full border-collapse rounded-control border border-rule bg-paper-raised text-sm">
          <thead>
            <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
              <th scope="col" className="px-3 py-2">E-mail</th>
              <th scope="col" className="px-3 py-2">Role</th>
              <th scope="col" className="px-3 py-2">Project</th>
              <th scope="col" className="px-3 py-2">Expires</th>
              <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {list.data.map((i) => (
              <tr key={i.id} className="border-b border-rule last:border-b-0">
                <td className="px-3 py-2">{i.email}</td>
                <td className="px-3 py-2"><RoleBadge role={i.role} /></td>
                <td className="px-3 py-2">{i.project?.name ?? '—'}</td>
                <td className="px-3 py-2 text-ink-muted">{formatDateTime(i.expiresAt)}</td>
                <td className="px-3 py-2 text-right">
                  <Button size="sm" variant="danger" busy={revoke.isPending && revoke.variables === i.id} onClick={() => revoke.mutate(i.id)}>Withdraw</Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </>
  );
}
