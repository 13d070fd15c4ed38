import type { z } from 'zod';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { FeasibleArmModelInput, feasibleArmParamsSchema, forwardModel } from '@shared/kinematics';
import type { ArmParams } from '@shared/schemas/armModel';
import { badRequest, notFound } from '../http/errors';
import { invalidInput } from '../http/validate';
import { ArmModel } from '../models';
import type { ArmReachSummary } from './armReachSummary';
import { runHeavy } from './workerPool';

/** Parameters of any arm model family (lengths mm, angles deg): the shared discriminated union plus the kinematic checks. */
export const ArmModelParams = feasibleArmParamsSchema;
export type ArmModelParams = ArmParams;
/** What a create or update sends (name + parameters), checked as ArmModelParams. */
export const ArmModelInput = FeasibleArmModelInput;
export type ArmModelInput = z.infer<typeof FeasibleArmModelInput>;
export { forwardModel };

/** An arm model as the API presents it (whitelisted fields; lengths mm, angles deg). */
export interface ArmModelDto {
  id: number;
  name: string;
  family: string;
  params: Record<string, unknown>;
  builtIn: boolean;
  createdBy: number | null;
  createdAt: string;
  updatedAt: string;
  /** Largest and smallest horizontal reach of the tool point from the J1 axis, mm (null when the stored parameters no longer parse). */
  maxReach: number | null;
  minReach: number | null;
  /** The stored reach figures (arm frame, mm; computed when the model was saved), null as above. */
  reach: ArmReachSummary | null;
}

/** The reach summary of new parameters, computed in the heavy-work pool (stored with the model on save). */
export function reachSummaryInPool(params: ArmModelParams): Promise<ArmReachSummary> {
  return runHeavy({ kind: 'armSummary', params });
}

/** An arm model as the API shows it; the reach figures come from the row (never recomputed here). */
export function presentArmModel(m: ArmModel): ArmModelDto {
  const summary = m.reachSummary ?? null;
  return {
    id: m.id,
    name: m.name,
    family: m.family,
    params: m.params,
    builtIn: m.builtIn,
    createdBy: m.createdBy,
    createdAt: m.createdAt.toISOString(),
    updatedAt: m.updatedAt.toISOString(),
    maxReach: summary ? summary.maxReach : null,
    minReach: summary ? summary.minReach : null,
    reach: summary,
  };
}

/** Parses the `model` of a kinematics request: `{id}` of a stored model, or the parameter JSON itself (400 with `model.*` field errors). */
export async function resolveModelParams(model: unknown): Promise<ArmModelParams> {
  if (model && typeof model === 'object' && !Array.isArray(model) && 'id' in model && !('family' in model)) {
    const id = (model as { id: unknown }).id;
    if (typeof id !== 'number' || !Number.isInteger(id) || id < 1 || id > 2147483647) {
      throw badRequest('The model id must be a positive whole number.', { 'model.id': 'Give the id of a stored arm model' });
    }
    const row = await ArmModel.findByPk(id);
    if (!row) throw notFound('Arm model');
    const parsed = ArmModelParams.safeParse(row.params);
    if (!parsed.success) throw badRequest(`The stored parameters of "${row.name}" are no longer valid; open the model and save it again.`);
    return parsed.data;
  }
  const parsed = ArmModelParams.safeParse(model ?? null);
  if (!parsed.success) throw invalidInput('The model', parsed.error.issues, model, 'model');
  return parsed.data;
}

/** Layouts (with their project) whose arms use the arm model. */
export async function layoutsUsingArmModel(
  sequelize: Sequelize,
  armModelId: number,
  transaction?: Transaction,
): Promise<Array<{ id: number; name: string; projectId: number; projectName: string }>> {
  return sequelize.query(
    `SELECT l.id, l.name, l."projectId", p.name AS "projectName"
       FROM layouts l JOIN projects p ON p.id = l."projectId"
      WHERE l.content->'arms' @> :needle::jsonb
      ORDER BY p.name, l.name`,
    { replacements: { needle: JSON.stringify([{ armModelId }]) }, type: QueryTypes.SELECT, transaction },
  );
}
