import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { ProjectDetailDto } from '@shared/schemas/project';
import { can } from '@shared/policy';
import { useSessionUser } from '../../api/auth';
import { useFloorPlans } from '../../api/floorPlans';
import { useCreateLayout, useDeleteLayout, useLayouts, useSetLayoutArchived, type LayoutSummaryDto } from '../../api/layouts';
import { formatDateTime } from '../../lib/format';
import { Button } from '../Button';
import { ConfirmDialog } from '../ConfirmDialog';
import { Dialog, DialogActions } from '../Dialog';
import { SelectField, TextField } from '../Field';
import { EmptyState, ErrorNotice, LoadingNotice } from '../Notice';

/** The project page's "Layouts" section: the working layouts, a new one, open, archive/restore and delete. */
export function LayoutsSection({ project }: { project: ProjectDetailDto }) {
  const user = useSessionUser();
  const projectArchived = project.archivedAt !== null;
  const mayWrite = can(user.role, 'layout.write') && !projectArchived;
  const [showArchived, setShowArchived] = useState(false);
  const layouts = useLayouts(project.id, showArchived ? 'archived' : 'active');
  const plans = useFloorPlans(project.id);
  const [creating, setCreating] = useState(false);
  const [deleting, setDeleting] = useState<LayoutSummaryDto | null>(null);
  const [archiving, setArchiving] = useState<LayoutSummaryDto | null>(null);
  const remove = useDeleteLayout(project.id);
  const archive = useSetLayoutArchived(project.id);
  const mayArchive = (l: LayoutSummaryDto) => !projectArchived && can(user.role, l.archivedAt ? 'layout.restore' : 'layout.archive');
  const hasActions = mayWrite || can(user.role, 'layout.archive') || can(user.role, 'layout.restore');

  if (layouts.isPending) return <LoadingNotice label="Loading cell layouts…" />;
  if (layouts.isError) return <ErrorNotice error={layouts.error} title="Layouts could not be loaded" />;
  const planName = (id: number | null) => (id === null ? '—' : (plans.data?.find((p) => p.id === id)?.fileName ?? `plan ${id}`));

  return (
    <div className="flex flex-col gap-4">
      <label className="flex items-center gap-2 self-end text-sm text-ink-muted">
        <input type="checkbox" checked={showArchived} onChange={(e) => setShowArchived(e.target.checked)} className="size-4 accent-accent" />
        Show archived cell layouts
      </label>
      {layouts.data.length === 0 ? (
        <EmptyState title="No cell layout yet — a cell layout places arms, work points and boundaries on a floor plan.">
          {!mayWrite && <p>A planner of the project adds it.</p>}
        </EmptyState>
      ) : (
        <table aria-label="Cell layouts" className="w-full border-collapse rounded-control border border-rule bg-paper-raised text-sm">
          <thead>
            <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
              <th scope="col" className="px-3 py-2">Layout</th>
              <th scope="col" className="px-3 py-2">Floor plan</th>
              <th scope="col" className="px-3 py-2 text-right">Arms</th>
              <th scope="col" className="px-3 py-2 text-right">Work points</th>
              <th scope="col" className="px-3 py-2 text-right">Boundaries</th>
              <th scope="col" className="px-3 py-2">Updated</th>
              {hasActions && <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>}
            </tr>
          </thead>
          <tbody>
            {layouts.data.map((l) => (
              <tr key={l.id} className="border-b border-rule last:border-b-0 hover:bg-paper">
                <td className="px-3 py-2">
                  <Link to={`/projects/${project.id}/layouts/${l.id}`} className="font-bold text-accent underline-offset-4 hover:underline">
                    {l.name}
                  </Link>
                  {l.archivedAt && <span className="ml-2 rounded-control border border-rule-strong px-1.5 py-0.5 text-xs text-ink-muted">Archived</span>}
                </td>
                <td className="px-3 py-2 text-ink-muted">{planName(l.floorPlanId)}</td>
                <td className="px-3 py-2 text-right tabular-nums">{l.counts.arms}</td>
                <td className="px-3 py-2 text-right tabular-nums">{l.counts.workPoints}</td>
                <td className="px-3 py-2 text-right tabular-nums">{l.counts.boundaries}</td>
                <td className="px-3 py-2 text-ink-muted tabular-nums">{formatDateTime(l.updatedAt)}</td>
                {hasActions && (
                  <td className="px-3 py-2 text-right whitespace-nowrap">
                    {mayArchive(l) && (
                      <Button size="sm" variant="quiet" aria-label={`${l.archivedAt ? 'Restore' : 'Archive'} ${l.name}`} onClick={() => setArchiving(l)}>
                        {l.archivedAt ? 'Restore' : 'Archive'}
                      </Button>
                    )}
                    {mayWrite && !l.archivedAt && (
                      <Button size="sm" variant="quiet" aria-label={`Delete ${l.name}`} onClick={() => setDeleting(l)}>
                        Delete
                      </Button>
                    )}
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {mayWrite && (
        <div>
          <Button variant="primary" onClick={() => setCreating(true)}>
            New cell layout
          </Button>
        </div>
      )}
      <NewLayoutDialog open={creating} onClose={() => setCreating(false)} project={project} plans={plans.data ?? []} />
      <ConfirmDialog
        open={deleting !== null}
        title="Delete this cell layout?"
        confirmLabel="Delete cell layout"
        busy={remove.isPending}
        error={remove.error}
        onClose={() => {
          setDeleting(null);
          remove.reset();
        }}
        onConfirm={() => deleting && remove.mutate(deleting.id, { onSuccess: () => setDeleting(null) })}
      >
        <p>
          <strong>{deleting?.name}</strong> and its {deleting?.counts.arms ?? 0} arms, {deleting?.counts.workPoints ?? 0} work points and {deleting?.counts.boundaries ?? 0} boundaries will be gone. A cell layout with submitted or released revisions cannot be deleted; archive it instead.
        </p>
      </ConfirmDialog>
      <ConfirmDialog
        open={archiving !== null}
        title={archiving?.archivedAt ? 'Restore this cell layout?' : 'Archive this cell layout?'}
        confirmLabel={archiving?.archivedAt ? 'Restore cell layout' : 'Archive cell layout'}
        confirmVariant="primary"
        busy={archive.isPending}
        error={archive.error}
        onClose={() => {
          setArchiving(null);
          archive.reset();
        }}
        onConfirm={() => archiving && archive.mutate({ id: archiving.id, archived: !archiving.archivedAt }, { onSuccess: () => setArchiving(null) })}
      >
        {archiving?.archivedAt ? (
          <p>
            <strong>{archiving.name}</strong> comes back to the list and can be edited again.
          </p>
        ) : (
          <p>
            <strong>{archiving?.name}</strong> leaves the list and becomes read-only. Its revisions and released plan sheets stay as they are;
            an admin can restore it.
          </p>
        )}
      </ConfirmDialog>
    </div>
  );
}

function NewLayoutDialog({ open, onClose, project, plans }: { open: boolean; onClose(): void; project: ProjectDetailDto; plans: Array<{ id: number; fileName: string }> }) {
  const create = useCreateLayout(project.id);
  const navigate = useNavigate();
  const [name, setName] = useState('');
  const [planId, setPlanId] = useState<string>('');
  const [error, setError] = useState<string | undefined>();
  const chosenPlan = planId || (plans[0] ? String(plans[0].id) : '');

  function submit(e: FormEvent) {
    e.preventDefault();
    if (!name.trim()) {
      setError('Name the cell layout');
      return;
    }
    setError(undefined);
    create.mutate(
      { name: name.trim(), floorPlanId: chosenPlan ? Number(chosenPlan) : null },
      {
        onSuccess: (l) => {
          onClose();
          setName('');
          void navigate(`/projects/${project.id}/layouts/${l.id}`);
        },
      },
    );
  }

  return (
    <Dialog open={open} title="New cell layout" onClose={onClose} description="A working copy where arms, work points and boundaries are placed on one floor plan.">
      <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
        <TextField label="Name" value={name} onChange={(e) => setName(e.target.value)} error={error} maxLength={160} autoFocus placeholder="e.g. Line 3 — option B" />
        <SelectField label="Floor plan" value={chosenPlan} onChange={(e) => setPlanId(e.target.value)} hint={plans.length === 0 ? 'The project has no floor plan yet; the cell layout starts on an empty sheet.' : undefined}>
          {plans.map((p) => (
            <option key={p.id} value={p.id}>
              {p.fileName}
            </option>
          ))}
          <option value="">No floor plan</option>
        </SelectField>
        {create.isError && <ErrorNotice error={create.error} />}
        <DialogActions>
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="primary" busy={create.isPending}>
            Create cell layout
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
