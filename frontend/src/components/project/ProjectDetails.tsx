import { useState, type ReactNode } from 'react';
import type { ProjectDetailDto } from '@shared/schemas/project';
import { can } from '@shared/policy';
import { useSessionUser } from '../../api/auth';
import { useUpdateProject } from '../../api/projects';
import { formatDateTime } from '../../lib/format';
import { Button } from '../Button';
import { StatusNote } from '../Notice';
import { ProjectForm } from '../ProjectForm';

function Detail({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="grid grid-cols-[10rem_1fr] gap-4 border-b border-rule py-2.5 last:border-b-0">
      <dt className="text-xs font-bold tracking-wide text-ink-muted uppercase">{term}</dt>
      <dd className="text-sm">{children}</dd>
    </div>
  );
}

const none = <span className="text-ink-faint">—</span>;

/** The project's details; planners and admins edit them in place. */
export function ProjectDetails({ project }: { project: ProjectDetailDto }) {
  const user = useSessionUser();
  const update = useUpdateProject(project.id);
  const [editing, setEditing] = useState(false);
  const [saved, setSaved] = useState(false);
  const mayEdit = can(user.role, 'project.write');

  if (editing) {
    return (
      <ProjectForm
        submitLabel="Save details"
        defaultValues={project}
        onCancel={() => setEditing(false)}
        onSubmit={async (values) => {
          await update.mutateAsync(values);
          setEditing(false);
          setSaved(true);
        }}
      />
    );
  }

  return (
    <div>
      <dl className="rounded-control border border-rule bg-paper-raised px-4">
        <Detail term="Project name">{project.name}</Detail>
        <Detail term="Client">{project.clientName}</Detail>
        <Detail term="Site">{project.siteName || none}</Detail>
        <Detail term="Description">
          {project.description ? <p className="whitespace-pre-line">{project.description}</p> : none}
        </Detail>
        <Detail term="Created">
          {formatDateTime(project.createdAt)}
          {project.createdBy ? ` by ${project.createdBy.name}` : ''}
        </Detail>
        <Detail term="Updated">{formatDateTime(project.updatedAt)}</Detail>
      </dl>
      {mayEdit && (
        <div className="mt-3 flex items-center gap-4">
          <Button
            onClick={() => {
              setSaved(false);
              setEditing(true);
            }}
          >
            Edit details
          </Button>
          {saved && <StatusNote>Details saved.</StatusNote>}
        </div>
      )}
    </div>
  );
}
