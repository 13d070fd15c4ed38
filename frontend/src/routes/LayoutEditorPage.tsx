import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import type { LayoutDto } from '@shared/schemas/layout';
import { Link, useParams } from 'react-router-dom';
import { can } from '@shared/policy';
import { useArmModels } from '../api/armModels';
import { useSessionUser } from '../api/auth';
import { isApiError } from '../api/client';
import { floorPlanDetailQuery } from '../api/floorPlans';
import { useLayout, useLayoutFirstView } from '../api/layouts';
import { useProject } from '../api/projects';
import { LayoutEditor } from '../components/layout/LayoutEditor';
import { SubmitRevisionButton } from '../components/review/SubmitRevisionButton';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import NotFoundPage from './NotFoundPage';
import { parseId } from '../lib/routeId';
import { usePageTitle } from '../lib/usePageTitle';

/** `/projects/:id/layouts/:layoutId` — the layout editor (read-only for reviewers). */
export default function LayoutEditorPage() {
  const params = useParams();
  const projectId = parseId(params.id);
  const layoutId = parseId(params.layoutId);
  if (projectId === null || layoutId === null) return <NotFoundPage />;
  // Keyed by id: opening another layout (e.g. a kept copy) starts a fresh editor and worker.
  return <LayoutEditorLoader key={layoutId} projectId={projectId} layoutId={layoutId} />;
}

function LayoutEditorLoader({ projectId, layoutId }: { projectId: number; layoutId: number }) {
  const user = useSessionUser();
  const layout = useLayout(layoutId);
  const project = useProject(projectId);
  const models = useArmModels();
  // The layout as first loaded: the server's analysis of that version is shown until the worker's
  // first result (later saves update the layout query but need no server analysis).
  const [opened, setOpened] = useState<LayoutDto | undefined>(undefined);
  if (!opened && layout.data) setOpened(layout.data);
  const firstQuery = useLayoutFirstView(layoutId);
  const firstData = firstQuery.data;
  const firstView = useMemo(() => (opened && firstData?.version === opened.version ? { content: opened.content, ...firstData } : null), [opened, firstData]);
  usePageTitle(layout.data?.name ?? 'Cell layout', project.data?.name);
  const floorPlanId = layout.data?.floorPlanId ?? null;
  const plan = useQuery({ ...floorPlanDetailQuery(floorPlanId ?? 0), enabled: floorPlanId !== null });
  const back = (
    <Link to={`/projects/${projectId}#layouts`} className="text-sm font-bold text-accent underline underline-offset-4">
      Back to the project
    </Link>
  );

  if (layout.isError || (layout.data && layout.data.projectId !== projectId)) {
    const missing = layout.isError ? isApiError(layout.error, 404) : true;
    return (
      <div className="flex max-w-xl flex-col gap-4 py-6">
        <h1 className="text-2xl font-bold">{missing ? 'Cell layout not found' : 'The cell layout could not be loaded'}</h1>
        {layout.isError && <ErrorNotice error={layout.error} />}
        {back}
      </div>
    );
  }
  if (models.isError) return <ErrorNotice title="The arm catalogue could not be loaded" error={models.error} />;
  if (floorPlanId !== null && plan.isError) return <ErrorNotice title="The floor plan could not be loaded" error={plan.error} />;
  if (layout.isPending || models.isPending || (floorPlanId !== null && plan.isPending)) return <LoadingNotice label="Loading the cell layout…" />;

  const l = layout.data;
  const readOnly = !can(user.role, 'layout.write');
  return (
    <>
      <PageHeader
        eyebrow={
          <span className="flex gap-1.5">
            <Link to="/projects" className="hover:text-ink">
              Projects
            </Link>
            <span aria-hidden>/</span>
            <Link to={`/projects/${projectId}#layouts`} className="hover:text-ink">
              {project.data?.name ?? 'Project'}
            </Link>
          </span>
        }
        title={l.name}
        lead={`Cell layout · ${plan.data ? `on ${plan.data.fileName}` : 'no floor plan'} · ${l.content.arms.length} arms, ${l.content.workPoints.length} work points, ${l.content.boundaries.length} boundaries`}
        actions={can(user.role, 'revision.submit') ? <SubmitRevisionButton projectId={projectId} layoutId={l.id} /> : undefined}
      />
      <LayoutEditor
        layout={l}
        floorPlan={floorPlanId !== null ? (plan.data ?? null) : null}
        armModels={models.data}
        readOnly={readOnly}
        firstView={firstView}
      />
    </>
  );
}
