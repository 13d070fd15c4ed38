import type { AnalysisResult, FloorLayer } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';
import type { Transaction } from 'sequelize';
import { HttpError } from '../http/errors';
import { ArmModel, FloorPlan, type Layout } from '../models';
import type { AnalysisJob, AnalysisViewResult } from '../workers/heavyTasks';
import { runHeavy } from './workerPool';

let maxChecks = 2_000_000;

/** Sets the most reach checks (arms × work points × work heights) one analysis may ask for. */
export function setAnalysisCap(cap: number): void {
  maxChecks = cap;
}

const n = (v: number) => v.toLocaleString('en-GB').replace(/,/g, ' ');

/** 413 naming the counts and the cap when a layout asks for more reach checks than one analysis may hold. */
export function assertAnalysisSize(content: Pick<LayoutContent, 'arms' | 'workPoints' | 'workHeights'>, cap = maxChecks): void {
  const arms = content.arms.length;
  const points = content.workPoints.length;
  const heights = Math.max(1, content.workHeights.length);
  const checks = arms * points * heights;
  if (checks > cap) {
    throw new HttpError(
      413,
      'analysis_too_large',
      `The cell layout asks for ${n(arms)} arms × ${n(points)} work points × ${n(heights)} work heights = ${n(checks)} reach checks; one analysis may hold at most ${n(cap)}. Split the cell layout into smaller ones.`,
      undefined,
      { limits: { arms, workPoints: points, workHeights: heights, checks, maxChecks: cap } },
    );
  }
}

/**
 * Runs the shared analysis on a layout as stored: its floor plan (layer roles and heights), the arm
 * models it places, its work points, boundaries and work heights. The database is read here; the
 * analysis itself runs in the heavy-work pool (services/workerPool.ts). Reads inside `transaction` when given.
 */
export async function analyzeLayout(layout: Layout, contentOverride?: LayoutContent, transaction?: Transaction): Promise<AnalysisResult> {
  return runHeavy({ kind: 'analysis', job: await analysisJob(layout, contentOverride, transaction) });
}

/**
 * The stored layout's analysis with each arm's maximum space, as the editor's worker would draw
 * them: the editor shows it on opening while its own worker starts (services/workerPool.ts keeps
 * the arm models' reach built between requests, so a warm server answers at once). `cap` lowers
 * the most reach checks answered (413 beyond it, before any work).
 */
export async function analyzeLayoutView(layout: Layout, cap = maxChecks): Promise<AnalysisViewResult> {
  assertAnalysisSize(layout.content as LayoutContent, Math.min(cap, maxChecks));
  return runHeavy({ kind: 'analysisView', job: await analysisJob(layout) });
}

async function analysisJob(layout: Layout, contentOverride?: LayoutContent, transaction?: Transaction): Promise<AnalysisJob> {
  const content = contentOverride ?? (layout.content as LayoutContent);
  assertAnalysisSize(content);
  const modelIds = [...new Set(content.arms.map((a) => a.armModelId))];
  const models = await ArmModel.findAll({ where: { id: modelIds }, attributes: ['id', 'params'], transaction });
  const fp = layout.floorPlanId ? await FloorPlan.findByPk(layout.floorPlanId, { attributes: ['id', 'geometry', 'layers'], transaction }) : null;
  return {
    models: models.map((m) => [m.id, m.params]),
    floor: fp ? { geometry: fp.geometry, layers: fp.layers as FloorLayer[] } : null,
    content: { arms: content.arms, workPoints: content.workPoints, boundaries: content.boundaries, workHeights: content.workHeights },
  };
}
