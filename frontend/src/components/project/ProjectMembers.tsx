import { useId, useState, type FormEvent } from 'react';
import type { ProjectDetailDto } from '@shared/schemas/project';
import { can } from '@shared/policy';
import { useSessionUser } from '../../api/auth';
import { useAddMember, useRemoveMember } from '../../api/projects';
import { useUsers } from '../../api/users';
import { formatDate } from '../../lib/format';
import { Button } from '../Button';
import { ErrorNotice } from '../Notice';
import { ROLE_LABEL, RoleBadge } from '../RoleBadge';

/** Who works on or receives the project; planners and admins add and remove people. */
export function ProjectMembers({ project }: { project: ProjectDetailDto }) {
  const user = useSessionUser();
  const mayManage = can(user.role, 'project.members');
  const users = useUsers({ enabled: mayManage && can(user.role, 'user.list') });
  const addMember = useAddMember(project.id);
  const removeMember = useRemoveMember(project.id);
  const [choice, setChoice] = useState('');
  const selectId = useId();

  const memberIds = new Set(project.members.map((m) => m.userId));
  const candidates = (users.data ?? [])
    .filter((u) => u.active && !memberIds.has(u.id))
    .sort((a, b) => a.name.localeCompare(b.name));

  function add(event: FormEvent) {
    event.preventDefault();
    const userId = Number(choice);
    if (!Number.isInteger(userId) || userId <= 0) return;
    addMember.mutate(userId, { onSuccess: () => setChoice('') });
  }

  const mutationError = addMember.error ?? removeMember.error;

  return (
    <div className="flex flex-col gap-4">
      {project.members.length === 0 ? (
        <p className="rounded-control border border-dashed border-rule-strong bg-paper-raised px-4 py-4 text-sm text-ink-muted">
          No members yet.{' '}
          {mayManage
            ? 'Add the planners and reviewers who work on this job, and the client contacts who should receive its plan sheets.'
            : ''}
        </p>
      ) : (
        <table aria-label="Members" className="w-full border-collapse rounded-control border border-rule bg-paper-raised text-sm">
          <thead>
            <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
              <th scope="col" className="px-3 py-2">Name</th>
              <th scope="col" className="px-3 py-2">E-mail</th>
              <th scope="col" className="px-3 py-2">Role</th>
              <th scope="col" className="px-3 py-2">Added</th>
              {mayManage && (
                <th scope="col" className="px-3 py-2">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {project.members.map((member) => (
              <tr key={member.userId} className="border-b border-rule last:border-b-0">
                <td className="px-3 py-2 font-bold">{member.name}</td>
                <td className="px-3 py-2 text-ink-muted">{member.email}</td>
                <td className="px-3 py-2">
                  <RoleBadge role={member.role} />
                </td>
                <td className="px-3 py-2 text-ink-muted tabular-nums">{formatDate(member.addedAt)}</td>
                {mayManage && (
                  <td className="px-3 py-2 text-right">
                    <Button
                      size="sm"
                      variant="quiet"
                      aria-label={`Remove ${member.name}`}
                      busy={removeMember.isPending && removeMember.variables === member.userId}
                      onClick={() => removeMember.mutate(member.userId)}
                    >
                      Remove
                    </Button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      )}

      {mutationError ? <ErrorNotice error={mutationError} /> : null}

      {mayManage && (
        <form onSubmit={add} className="flex items-end gap-2">
          <div className="flex flex-col gap-1">
            <label htmlFor={selectId} className="text-xs font-bold tracking-wide text-ink-muted uppercase">
              Add a member
            </label>
            <select
              id={selectId}
              value={choice}
              onChange={(event) => setChoice(event.target.value)}
              disabled={users.isPending || candidates.length === 0}
              className="h-9 w-80 rounded-control border border-rule-strong bg-paper-raised px-3 text-sm"
            >
              <option value="">
                {users.isPending ? 'Loading people…' : candidates.length === 0 ? 'Everyone is already a member' : 'Choose a person'}
              </option>
              {candidates.map((u) => (
                <option key={u.id} value={u.id}>
                  {u.name} — {ROLE_LABEL[u.role]} ({u.email})
                </option>
              ))}
            </select>
          </div>
          <Button type="submit" busy={addMember.isPending} disabled={!choice}>
            Add member
          </Button>
        </form>
      )}
      {mayManage && users.isError && <ErrorNotice title="The list of people could not be loaded" error={users.error} />}
    </div>
  );
}
