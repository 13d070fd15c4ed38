import { Link, useNavigate } from 'react-router-dom';
import type { ProjectDetailDto } from '@shared/schemas/project';
import { UNIT_NAMES } from '@shared/schemas/floorPlan';
import { can } from '@shared/policy';
import { useSessionUser } from '../../api/auth';
import { useFloorPlans } from '../../api/floorPlans';
import { formatDateTime } from '../../lib/format';
import { EmptyState, ErrorNotice, LoadingNotice } from '../Notice';
import { FloorPlanUpload } from './FloorPlanUpload';

export const EMPTY_FLOOR_PLANS = 'No floor plan yet — upload the building\u2019s DXF drawing (ASCII DXF, any version).';

/** The project page's "Floor plans" section: the project's plans and, for planners, the upload. */
export function FloorPlanSection({ project }: { project: ProjectDetailDto }) {
  const user = useSessionUser();
  const mayWrite = can(user.role, 'floorPlan.write');
  const plans = useFloorPlans(project.id);
  const navigate = useNavigate();

  if (plans.isPending) return <LoadingNotice label="Loading floor plans…" />;
  if (plans.isError) return <ErrorNotice error={plans.error} title="Floor plans could not be loaded" />;

  const list = plans.data;
  return (
    <div className="flex flex-col gap-4">
      {list.length === 0 ? (
        <EmptyState title={EMPTY_FLOOR_PLANS}>
          {!mayWrite && <p>A planner of the project adds it.</p>}
        </EmptyState>
      ) : (
        <table aria-label="Floor plans" className="w-full border-collapse rounded-control border border-rule bg-paper-raised text-sm">
          <thead>
            <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
              <th scope="col" className="px-3 py-2">Drawing</th>
              <th scope="col" className="px-3 py-2">Units</th>
              <th scope="col" className="px-3 py-2">Size</th>
              <th scope="col" className="px-3 py-2">Layers</th>
              <th scope="col" className="px-3 py-2">Uploaded</th>
            </tr>
          </thead>
          <tbody>
            {list.map((p) => (
              <tr key={p.id} className="border-b border-rule last:border-b-0 hover:bg-paper">
                <td className="px-3 py-2">
                  <Link to={`/projects/${project.id}/floor-plans/${p.id}`} className="font-bold text-accent underline-offset-4 hover:underline">
                    {p.fileName}
                  </Link>
                  {p.warnings.length > 0 && (
                    <span className="ml-2 text-xs text-finding-warning">
                      {p.warnings.length} {p.warnings.length === 1 ? 'note' : 'notes'}
                    </span>
                  )}
                </td>
                <td className="px-3 py-2 text-ink-muted">{UNIT_NAMES.find((u) => u.name === p.units)?.label ?? p.units}</td>
                <td className="px-3 py-2 text-ink-muted tabular-nums">{extentText(p.bounds)}</td>
                <td className="px-3 py-2 text-ink-muted tabular-nums">{p.layers.length}</td>
                <td className="px-3 py-2 text-ink-muted tabular-nums">{formatDateTime(p.createdAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {mayWrite && (
        <FloorPlanUpload projectId={project.id} onUploaded={(plan) => void navigate(`/projects/${project.id}/floor-plans/${plan.id}`)} />
      )}
    </div>
  );
}

/** "24.0 m × 16.0 m" — the width and depth of a plan's bounds (mm in, metres out). */
export function extentText(b: { minX: number; minY: number; maxX: number; maxY: number }): string {
  const w = (b.maxX - b.minX) / 1000;
  const h = (b.maxY - b.minY) / 1000;
  const f = (m: number) => (m >= 100 ? m.toFixed(0) : m.toFixed(1));
  return `${f(w)} m × ${f(h)} m`;
}
