import { Router } from 'express';
import { z } from 'zod';
import { allow } from '../auth/guards';
import { HttpError } from '../http/errors';
import { parseOr400 } from '../http/validate';
import { forwardModel, resolveModelParams } from '../services/armModels';
import { runHeavy } from '../services/workerPool';

const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);

const ForwardBody = z.object({
  model: z.unknown(),
  joints: z.array(finite('Each joint value'), { error: 'joints must be a list of controller values (deg, or mm for a stroke)' }).max(12, 'At most 12 joint values'),
});

const ReachBody = z.object({
  model: z.unknown(),
  heights: z
    .array(finite('Each height').refine((v) => Math.abs(v) <= 100_000, 'Heights must be within ±100 000 mm'), { error: 'heights must be a list of heights in mm' })
    .max(50, 'At most 50 heights')
    .optional(),
});

/** Forward kinematics and reach of a model (stored `{id}` or inline parameters), arm frame, mm. */
export function kinematicsRouter(): Router {
  const r = Router();

  r.post('/kinematics/forward', allow('kinematics.use'), async (req, res) => {
    const body = parseOr400(ForwardBody, req.body);
    const params = await resolveModelParams(body.model);
    const result = forwardModel(params, body.joints);
    if (!result.ok) {
      // An unreachable or unassemblable pose is an answer about the pose, not a malformed request.
      throw new HttpError(422, result.reason.replaceAll('-', '_'), result.message, undefined, {
        reason: result.reason,
        ...(result.axis !== undefined ? { axis: result.axis } : {}),
      });
    }
    res.json({ tool: result.tool, wrist: result.wrist, frames: result.frames });
  });

  r.post('/kinematics/reach', allow('kinematics.use'), async (req, res) => {
    const body = parseOr400(ReachBody, req.body);
    const params = await resolveModelParams(body.model);
    // Profiles of long chains take a while: computed in the heavy-work pool, never on this thread.
    res.json(await runHeavy({ kind: 'reach', params, heights: body.heights ?? [] }));
  });

  return r;
}
