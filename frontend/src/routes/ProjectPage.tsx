import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { can } from '@shared/policy';
import { useSessionUser } from '../api/auth';
import { isApiError } from '../api/client';
import { useDeleteProject, useProject, useSetProjectArchived } from '../api/projects';
import { Button } from '../components/Button';
import { ConfirmDialog } from '../components/ConfirmDialog';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import { PROJECT_SECTIONS } from './projectSections';
import NotFoundPage from './NotFoundPage';
import { formatDateTime } from '../lib/format';
import { parseId } from '../lib/routeId';
import { usePageTitle } from '../lib/usePageTitle';

/** One project: its sections (details, members, and what later pages add), archiving and deletion. */
export default function ProjectPage() {
  const id = parseId(useParams().id);
  if (id === null) return <NotFoundPage />;
  return <ProjectView id={id} />;
}

function ProjectView({ id }: { id: number }) {
  const user = useSessionUser();
  const project = useProject(id);
  usePageTitle(project.data?.name ?? 'Project');
  const remove = useDeleteProject(id);
  const archive = useSetProjectArchived(id);
  const navigate = useNavigate();
  const [confirming, setConfirming] = useState(false);
  const [archiving, setArchiving] = useState(false);

  if (project.isPending) return <LoadingNotice label="Loading project…" />;
  if (project.isError) {
    return (
      <div className="flex max-w-xl flex-col gap-4 py-6">
        <h1 className="text-2xl font-bold">{isApiError(project.error, 404) ? 'Project not found' : 'Project could not be loaded'}</h1>
        <ErrorNotice error={project.error} />
        <Link to="/projects" className="text-sm font-bold text-accent underline underline-offset-4">
          Back to projects
        </Link>
      </div>
    );
  }

  const p = project.data;
  const sections = PROJECT_SECTIONS.filter((s) => !s.requires || can(user.role, s.requires));
  const archived = p.archivedAt !== null;
  const mayDelete = can(user.role, 'project.write') && !archived;
  const mayArchive = archived ? can(user.role, 'project.restore') : can(user.role, 'project.archive');

  return (
    <>
      <PageHeader
        eyebrow={
          <Link to="/projects" className="hover:text-ink">
            Projects
          </Link>
        }
        title={p.name}
        lead={[p.clientName, p.siteName].filter(Boolean).join(' · ')}
        actions={
          mayDelete || mayArchive ? (
            <div className="flex gap-2">
              {mayArchive && <Button onClick={() => setArchiving(true)}>{archived ? 'Restore project' : 'Archive project'}</Button>}
              {mayDelete && (
                <Button variant="danger" onClick={() => setConfirming(true)}>
                  Delete project
                </Button>
              )}
            </div>
          ) : null
        }
      />
      {archived && (
        <p role="status" className="mb-6 rounded-control border border-rule-strong bg-paper-sunk px-3 py-2 text-sm">
          <strong>Archived</strong> on {formatDateTime(p.archivedAt!)} — read-only and hidden from the project list.{' '}
          {can(user.role, 'project.restore') ? 'Restore it to make changes.' : 'An admin can restore it.'}
        </p>
      )}

      <div className="grid grid-cols-[11rem_1fr] gap-10">
        <nav aria-label="Project sections" className="sticky top-6 self-start">
          <ul className="flex flex-col border-l border-rule text-sm">
            {sections.map((s) => (
              <li key={s.id}>
                <a href={`#${s.id}`} className="-ml-px block border-l-2 border-transparent py-1.5 pl-3 text-ink-muted hover:border-accent hover:text-ink">
                  {s.title}
                </a>
              </li>
            ))}
          </ul>
        </nav>
        <div className="flex min-w-0 flex-col gap-10">
          {sections.map(({ id: sectionId, title, lead, Component }) => (
            <section key={sectionId} id={sectionId} aria-labelledby={`${sectionId}-title`} className="scroll-mt-6">
              <h2 id={`${sectionId}-title`} className="text-lg font-bold">
                {title}
              </h2>
              {lead && <p className="mt-0.5 text-sm text-ink-muted">{lead}</p>}
              <div className="mt-3">
                <Component project={p} />
              </div>
            </section>
          ))}
        </div>
      </div>

      <ConfirmDialog
        open={archiving}
        title={archived ? 'Restore this project?' : 'Archive this project?'}
        confirmLabel={archived ? 'Restore project' : 'Archive project'}
        confirmVariant="primary"
        busy={archive.isPending}
        error={archive.error}
        onClose={() => {
          setArchiving(false);
          archive.reset();
        }}
        onConfirm={() => archive.mutate(!archived, { onSuccess: () => setArchiving(false) })}
      >
        {archived ? (
          <p>
            <strong>{p.name}</strong> comes back to the project list and can be changed again.
          </p>
        ) : (
          <p>
            <strong>{p.name}</strong> leaves the project list and becomes read-only. Its revisions and released plan sheets stay as
            they are; an admin can restore the project.
          </p>
        )}
      </ConfirmDialog>

      <ConfirmDialog
        open={confirming}
        title="Delete this project?"
        confirmLabel="Delete project"
        busy={remove.isPending}
        error={remove.error}
        onClose={() => {
          setConfirming(false);
          remove.reset();
        }}
        onConfirm={() =>
          remove.mutate(undefined, {
            onSuccess: () => void navigate('/projects', { replace: true }),
          })
        }
      >
        <p>
          <strong>{p.name}</strong> for {p.clientName} will be deleted together with its members list
          {/* Later sections (floor plans, layouts) are deleted with the project by the server. */}
          {' '}and everything filed under it. This cannot be undone. A project with submitted or released revisions cannot be
          deleted; archive it instead.
        </p>
      </ConfirmDialog>
    </>
  );
}
