import { useEffect, useMemo, useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import type { LayerPatch } from '@shared/schemas/floorPlan';
import { can } from '@shared/policy';
import { useSessionUser } from '../api/auth';
import { isApiError } from '../api/client';
import { floorPlanSourceUrl, useDeleteFloorPlan, useFloorPlan, useSaveLayerRoles, useUpdateFloorPlan, type FloorPlanDto } from '../api/floorPlans';
import { useProject } from '../api/projects';
import { Button } from '../components/Button';
import { ConfirmDialog } from '../components/ConfirmDialog';
import { extentText } from '../components/floorPlan/FloorPlanSection';
import { ImportNotes } from '../components/floorPlan/ImportNotes';
import { LayerTable } from '../components/floorPlan/LayerTable';
import { layerStylesFor } from '../components/floorPlan/layerRoles';
import { UnitCheckNotice } from '../components/floorPlan/UnitCheckNotice';
import { UnitsPicker } from '../components/floorPlan/UnitsPicker';
import { ErrorNotice, LoadingNotice } from '../components/Notice';
import { PageHeader } from '../components/PageHeader';
import type { PlanCanvas } from '../plan/planCanvas';
import { PlanView } from '../plan/PlanView';
import NotFoundPage from './NotFoundPage';
import { parseId } from '../lib/routeId';
import { usePageTitle } from '../lib/usePageTitle';

const metreFormat = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });
const metres = (mm: number) => `${metreFormat.format(mm / 1000)} m`;

/** One floor plan of a project: import notes, drawing unit, layer roles, preview, download, delete. */
export default function FloorPlanPage() {
  const params = useParams();
  const projectId = parseId(params.id);
  const planId = parseId(params.planId);
  if (projectId === null || planId === null) return <NotFoundPage />;
  return <FloorPlanView projectId={projectId} planId={planId} />;
}

function FloorPlanView({ projectId, planId }: { projectId: number; planId: number }) {
  const plan = useFloorPlan(planId);
  const project = useProject(projectId);
  usePageTitle(plan.data?.fileName ?? 'Floor plan', project.data?.name);

  if (plan.isPending) return <LoadingNotice label="Loading the floor plan…" />;
  if (plan.isError || plan.data.projectId !== projectId) {
    const missing = plan.isError ? isApiError(plan.error, 404) : true;
    return (
      <div className="flex max-w-xl flex-col gap-4 py-6">
        <h1 className="text-2xl font-bold">{missing ? 'Floor plan not found' : 'The floor plan could not be loaded'}</h1>
        {plan.isError && <ErrorNotice error={plan.error} />}
        <Link to={`/projects/${projectId}#floor-plans`} className="text-sm font-bold text-accent underline underline-offset-4">
          Back to the project
        </Link>
      </div>
    );
  }
  return <FloorPlanDetail plan={plan.data} projectName={project.data?.name} />;
}

function FloorPlanDetail({ plan, projectName }: { plan: FloorPlanDto; projectName?: string }) {
  const user = useSessionUser();
  const mayWrite = can(user.role, 'floorPlan.write');
  const update = useUpdateFloorPlan(plan.id);
  const remove = useDeleteFloorPlan(plan.id, plan.projectId);
  const navigate = useNavigate();
  const [hidden, setHidden] = useState<ReadonlySet<string>>(new Set());
  const [confirming, setConfirming] = useState(false);
  const [savingLayer, setSavingLayer] = useState<string | null>(null);
  const [canvas, setCanvas] = useState<PlanCanvas | null>(null);
  const saveRoles = useSaveLayerRoles(plan.projectId);
  const openEnds = plan.stats.gaps?.ends;
  const moved = plan.origin && (plan.origin.x !== 0 || plan.origin.y !== 0);
  const unitBusy = update.isPending && update.variables?.units !== undefined;

  // Ends of the floor outline that meet nothing: small rings in screen space, kept on zoom/pan.
  useEffect(() => {
    if (!canvas || !openEnds?.length) return;
    const draw = () =>
      canvas.setOverlay(
        'open-ends',
        (layer, v) => {
          layer.selectAll('*').remove();
          for (const p of openEnds) {
            const [sx, sy] = v.toScreen({ x: p.x, y: p.y });
            layer
              .append('circle')
              .attr('cx', sx)
              .attr('cy', sy)
              .attr('r', 6)
              .attr('fill', 'none')
              .attr('stroke', 'var(--color-finding-warning)')
              .attr('stroke-width', 2)
              .attr('data-open-end', `${p.x},${p.y}`);
          }
        },
        { space: 'screen', order: 40 },
      );
    draw();
    const off = canvas.onView(draw);
    return () => {
      off();
      canvas.removeOverlay('open-ends');
    };
  }, [canvas, openEnds]);

  const styles = useMemo(() => layerStylesFor(plan.layers, hidden), [plan.layers, hidden]);
  const projectPath = `/projects/${plan.projectId}`;

  function toggle(name: string) {
    setHidden((old) => {
      const next = new Set(old);
      if (next.has(name)) next.delete(name);
      else next.add(name);
      return next;
    });
  }

  function changeLayer(patch: LayerPatch) {
    setSavingLayer(patch.name);
    update.mutate({ layers: [patch] }, { onSettled: () => setSavingLayer(null) });
  }

  return (
    <>
      <PageHeader
        eyebrow={
          <span className="flex gap-1.5">
            <Link to="/projects" className="hover:text-ink">
              Projects
            </Link>
            <span aria-hidden>/</span>
            <Link to={`${projectPath}#floor-plans`} className="hover:text-ink">
              {projectName ?? 'Project'}
            </Link>
          </span>
        }
        title={plan.fileName}
        lead={`Floor plan · ${extentText(plan.bounds)} · ${plan.stats.features} shapes on ${plan.layers.length} layers`}
        actions={
          <>
            <a
              href={floorPlanSourceUrl(plan.id)}
              download={plan.fileName}
              className="inline-flex h-9 items-center rounded-control border border-rule-strong bg-paper-raised px-4 text-sm font-bold hover:bg-paper-sunk"
            >
              Download original
            </a>
            {mayWrite && (
              <Button variant="danger" onClick={() => setConfirming(true)}>
                Delete
              </Button>
            )}
          </>
        }
      />

      <div className="flex flex-col gap-6">
        {plan.unitCheck && (
          <UnitCheckNotice check={plan.unitCheck} busy={unitBusy} onChoose={mayWrite ? (units) => update.mutate({ units }) : undefined} />
        )}
        <ImportNotes warnings={plan.warnings.filter((w) => w !== plan.unitCheck?.message)} notes={plan.notes} />
        {moved && (
          <p className="text-sm text-ink-muted" data-origin={`${plan.origin.x},${plan.origin.y}`}>
            <span className="font-bold text-ink">Local origin. </span>
            The drawing lies far from its own 0,0 (map grid coordinates), so it is shown moved by{' '}
            {metres(plan.origin.x)} east and {metres(plan.origin.y)} north. The cell layout's DXF export moves it back.
          </p>
        )}
        {update.isError && <ErrorNotice title="The change was not saved" error={update.error} />}

        <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_33rem]">
          <PlanView
            geometry={plan.geometry}
            layerStyles={styles}
            bounds={plan.bounds}
            label={`Preview of ${plan.fileName}`}
            onCanvas={setCanvas}
            className="h-[34rem] xl:h-[40rem]"
          />
          <div className="flex min-w-0 flex-col gap-5">
            <UnitsPicker
              units={plan.units}
              source={plan.unitsSource}
              busy={unitBusy}
              onChange={mayWrite ? (units) => update.mutate({ units }) : undefined}
            />
            <div className="flex flex-col gap-2">
              <h2 className="text-xs font-bold tracking-wide text-ink-muted uppercase">Layers</h2>
              <p className="text-xs text-ink-muted">
                {mayWrite
                  ? 'Say what each layer stands for. Hiding a layer only changes this preview.'
                  : 'What each layer stands for. Hiding a layer only changes this preview.'}
              </p>
              <LayerTable
                layers={plan.layers}
                hidden={hidden}
                onToggle={toggle}
                onChange={mayWrite ? changeLayer : undefined}
                savingLayer={savingLayer}
              />
              {mayWrite && (
                <div className="flex flex-wrap items-center gap-3 pt-1">
                  <Button
                    size="sm"
                    busy={saveRoles.isPending}
                    onClick={() => saveRoles.mutate(plan.layers.map((l) => ({ name: l.name, role: l.role, height: l.height })))}
                  >
                    Save these roles for this project
                  </Button>
                  <span className="text-xs text-ink-muted" role="status">
                    {saveRoles.isSuccess
                      ? 'Saved: the next drawing uploaded to this project takes these roles for layers of the same name.'
                      : 'The next drawing uploaded to this project then takes them for layers of the same name.'}
                  </span>
                </div>
              )}
              {saveRoles.isError && <ErrorNotice title="The roles were not saved" error={saveRoles.error} />}
            </div>
          </div>
        </div>
      </div>

      <ConfirmDialog
        open={confirming}
        title="Delete this floor plan?"
        confirmLabel="Delete floor plan"
        busy={remove.isPending}
        error={remove.error}
        onClose={() => {
          setConfirming(false);
          remove.reset();
        }}
        onConfirm={() => remove.mutate(undefined, { onSuccess: () => void navigate(`${projectPath}#floor-plans`, { replace: true }) })}
      >
        <p>
          <strong>{plan.fileName}</strong> and its layer roles will be deleted. A floor plan that a cell layout is drawn on cannot be
          deleted until that layout is moved to another plan or deleted.
        </p>
      </ConfirmDialog>
    </>
  );
}
