import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { ProjectDto } from '@shared/schemas/project';
import { can } from '@shared/policy';
import { useSessionUser } from '../api/auth';
import { useCreateProject, useProjects } from '../api/projects';
import { Button } from '../components/Button';
import { DataTable } from '../components/DataTable';
import { Dialog } from '../components/Dialog';
import { SelectField } from '../components/Field';
import { EmptyState, ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { ProjectForm } from '../components/ProjectForm';
import { formatDateTime } from '../lib/format';
import { usePageTitle } from '../lib/usePageTitle';

const column = createColumnHelper<ProjectDto>();

const COLUMNS = [
  column.accessor('name', {
    header: 'Name',
    cell: (info) => (
      <Link to={`/projects/${info.row.original.id}`} className="font-bold text-ink underline-offset-4 hover:text-accent hover:underline">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('clientName', { header: 'Client' }),
  column.accessor('siteName', {
    header: 'Site',
    cell: (info) => info.getValue() || <span className="text-ink-faint">—</span>,
  }),
  column.accessor('memberCount', {
    header: 'Members',
    cell: (info) => <span className="tabular-nums">{info.getValue()}</span>,
    enableGlobalFilter: false,
  }),
  column.accessor('updatedAt', {
    header: 'Updated',
    cell: (info) => (
      <time dateTime={info.getValue()} className="whitespace-nowrap text-ink-muted tabular-nums">
        {formatDateTime(info.getValue())}
      </time>
    ),
    sortingFn: 'datetime',
    enableGlobalFilter: false,
  }),
];

/** All projects the signed-in person may see, with a dialog to start a new one. */
export default function ProjectsPage() {
  usePageTitle('Projects');
  const user = useSessionUser();
  const [show, setShow] = useState<'active' | 'archived'>('active');
  const projects = useProjects(show);
  const createProject = useCreateProject();
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);
  const mayCreate = can(user.role, 'project.write');
  const data = useMemo(() => projects.data ?? [], [projects.data]);

  const newButton = mayCreate ? (
    <Button variant="primary" onClick={() => setCreating(true)}>
      New project
    </Button>
  ) : null;

  return (
    <>
      <PageHeader
        title="Projects"
        lead={
          user.role === 'client'
            ? 'Projects you have been invited to.'
            : 'One project per customer job: its floor plans, cell layouts, revisions and plan sheets.'
        }
        actions={data.length > 0 ? newButton : null}
      />

      <div className="mb-4 flex justify-end">
        <SelectField label="Show" value={show} onChange={(e) => setShow(e.target.value as 'active' | 'archived')} frameClassName="w-52">
          <option value="active">Projects in use</option>
          <option value="archived">Archived</option>
        </SelectField>
      </div>

      {projects.isPending && <LoadingNotice label="Loading projects…" />}
      {projects.isError && <ErrorNotice title="Projects could not be loaded" error={projects.error} />}
      {projects.isSuccess && data.length === 0 && show === 'archived' && (
        <EmptyState title="No archived projects.">
          A project with released plan sheets is archived instead of deleted; it shows here, read-only, until an admin restores it.
        </EmptyState>
      )}
      {projects.isSuccess && data.length === 0 && show === 'active' && (
        <EmptyState
          title={mayCreate ? 'No projects yet — create the first one for your client.' : 'No projects to show yet.'}
          action={newButton}
        >
          {mayCreate
            ? 'A project holds one customer job: the client, the site, its floor plans and cell layouts.'
            : user.role === 'client'
              ? 'When a planner invites you to a project, it appears here.'
              : 'Projects appear here as soon as a planner creates them.'}
        </EmptyState>
      )}
      {projects.isSuccess && data.length > 0 && (
        <DataTable
          label="Projects"
          data={data}
          columns={COLUMNS}
          getRowId={(p) => String(p.id)}
          filterLabel="Filter projects"
          filterPlaceholder="Name, client or site"
          initialSorting={[{ id: 'updatedAt', desc: true }]}
          noMatch="No project matches the filter. Clear the filter box to see all projects."
        />
      )}

      <Dialog
        open={creating}
        title="New project"
        description="Who the job is for and where the cell will stand. You can change all of it later."
        onClose={() => setCreating(false)}
        width="lg"
      >
        <ProjectForm
          submitLabel="Create project"
          onCancel={() => setCreating(false)}
          onSubmit={async (values) => {
            const project = await createProject.mutateAsync(values);
            setCreating(false);
            void navigate(`/projects/${project.id}`);
          }}
        />
      </Dialog>
    </>
  );
}
