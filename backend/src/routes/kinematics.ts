import { Router } from 'express';
import { z } from 'zod';
import { allow } from '../auth/guards';
import { HttpError } from '../http/errors';
import { parseOr400 } from '../http/validate';
import { forwardModel, resolveModelParams } from '../services/armModels';
import { runHeavy } from '../services/workerPool';

// zod's number refuses NaN and ±Infinity; labels of the messages come from shared/schemas/labels.ts.
const finite = () => z.number();

const ForwardBody = z.object({
  model: z.unknown(),
  joints: z.array(finite(), { error: 'Give the joint values as a list of controller values (deg, or mm for a stroke)' }).max(12, 'Give at most 12 joint values'),
});

const ReachBody = z.object({
  model: z.unknown(),
  heights: z
    .array(finite().refine((v) => Math.abs(v) <= 100_000, 'Heights must be within ±100 000 mm'), { error: 'Give the heights as a list, in mm' })
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
