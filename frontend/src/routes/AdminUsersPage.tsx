import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import type { Role, UserDto } from '@shared/schemas/user';
import { ROLES } from '@shared/schemas/user';
import { useSessionUser } from '../api/auth';
import { useCreateUser, useUpdateUser, useUsers } from '../api/users';
import { Button } from '../components/Button';
import { DataTable } from '../components/DataTable';
import { Dialog } from '../components/Dialog';
import { EmptyState, ErrorNotice, LoadingNotice, StatusNote } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { RequirePermission } from '../components/RequireAuth';
import { ROLE_LABEL } from '../components/RoleBadge';
import { UserCreateForm } from '../components/users/UserCreateForm';
import { cn } from '../lib/cn';
import { usePageTitle } from '../lib/usePageTitle';

const column = createColumnHelper<UserDto>();

/** People with an account: create accounts, change roles, deactivate and reactivate (admin only). */
export default function AdminUsersPage() {
  usePageTitle('People');
  return (
    <RequirePermission action="user.manage">
      <UsersAdmin />
    </RequirePermission>
  );
}

function UsersAdmin() {
  const me = useSessionUser();
  const users = useUsers();
  const createUser = useCreateUser();
  const updateUser = useUpdateUser();
  const [creating, setCreating] = useState(false);
  const [note, setNote] = useState<string | null>(null);

  const columns = useMemo(
    () => [
      column.accessor('email', { header: 'E-mail', cell: (info) => <span className="font-bold">{info.getValue()}</span> }),
      column.accessor('name', { header: 'Name' }),
      column.accessor('role', {
        header: 'Role',
        cell: (info) => {
          const user = info.row.original;
          const self = user.id === me.id;
          return (
            <select
              aria-label={`Role of ${user.name}`}
              value={user.role}
              disabled={self || (updateUser.isPending && updateUser.variables?.id === user.id)}
              title={self ? 'You cannot change your own role.' : undefined}
              onChange={(event) => {
                const role = event.target.value as Role;
                setNote(null);
                updateUser.mutate(
                  { id: user.id, changes: { role } },
                  { onSuccess: (u) => setNote(`${u.name} is now ${ROLE_LABEL[u.role].toLowerCase()}.`) },
                );
              }}
              className="h-8 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm disabled:opacity-60"
            >
              {ROLES.map((role) => (
                <option key={role} value={role}>
                  {ROLE_LABEL[role]}
                </option>
              ))}
            </select>
          );
        },
      }),
      column.accessor('active', {
        header: 'Status',
        cell: (info) => (
          <span className={cn('inline-flex items-center gap-1.5 text-sm', info.getValue() ? 'text-ink' : 'text-ink-faint')}>
            <span aria-hidden className={cn('size-2 rounded-full', info.getValue() ? 'bg-accent' : 'border border-ink-faint')} />
            {info.getValue() ? 'Active' : 'Deactivated'}
          </span>
        ),
        enableGlobalFilter: false,
      }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (info) => {
          const user = info.row.original;
          if (user.id === me.id) return <span className="text-xs text-ink-faint">You</span>;
          const label = user.active ? 'Deactivate' : 'Reactivate';
          return (
            <Button
              size="sm"
              variant={user.active ? 'danger' : 'secondary'}
              aria-label={`${label} ${user.name}`}
              busy={updateUser.isPending && updateUser.variables?.id === user.id}
              onClick={() => {
                setNote(null);
                updateUser.mutate(
                  { id: user.id, changes: { active: !user.active } },
                  { onSuccess: (u) => setNote(`${u.name} is ${u.active ? 'active again' : 'deactivated and can no longer sign in'}.`) },
                );
              }}
            >
              {label}
            </Button>
          );
        },
      }),
    ],
    [me.id, updateUser],
  );

  const data = useMemo(() => users.data ?? [], [users.data]);

  return (
    <>
      <PageHeader
        title="People"
        lead="Accounts and roles. Planners build cell layouts, reviewers sign them off, clients receive released plan sheets."
        actions={
          <Button variant="primary" onClick={() => setCreating(true)}>
            New user
          </Button>
        }
      />
      {updateUser.isError && <ErrorNotice className="mb-4" title="The change was not saved" error={updateUser.error} />}
      {note && (
        <div className="mb-4">
          <StatusNote>{note}</StatusNote>
        </div>
      )}
      {users.isPending && <LoadingNotice label="Loading people…" />}
      {users.isError && <ErrorNotice title="People could not be loaded" error={users.error} />}
      {users.isSuccess && data.length === 0 && (
        <EmptyState title="No accounts yet — create one for each person on the team." />
      )}
      {users.isSuccess && data.length > 0 && (
        <DataTable
          label="Users"
          data={data}
          columns={columns}
          getRowId={(u) => String(u.id)}
          filterLabel="Filter people"
          filterPlaceholder="E-mail, name or role"
          initialSorting={[{ id: 'name', desc: false }]}
          noMatch="Nobody matches the filter."
        />
      )}

      <Dialog
        open={creating}
        title="New user"
        description="The person signs in with this e-mail and the temporary password."
        onClose={() => setCreating(false)}
      >
        <UserCreateForm
          onCancel={() => setCreating(false)}
          onSubmit={async (values) => {
            const user = await createUser.mutateAsync(values);
            setCreating(false);
            setNote(`Account created for ${user.name} (${user.email}).`);
          }}
        />
      </Dialog>
    </>
  );
}
