import { Router } from 'express';
import { z } from 'zod';
import { NotCoveredError, SAFEGUARD_DEVICES, SafeguardInputError, MESH_SHAPES, reachOverDistance, reachThroughDistance, separationDistance } from '@shared/safety';
import { allow } from '../auth/guards';
import { HttpError, badRequest } from '../http/errors';
import { parseOr400 } from '../http/validate';

const num = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);

const SeparationBody = z.object({
  device: z.enum(SAFEGUARD_DEVICES, { error: `device must be one of ${SAFEGUARD_DEVICES.join(', ')}` }),
  resolutionMm: num('resolutionMm').optional(),
  beams: num('beams').optional(),
  approach: z.enum(['normal', 'parallel'], { error: 'approach must be normal or parallel' }).optional(),
  heightMm: num('heightMm').optional(),
  responseTimeS: num('responseTimeS'),
  stopTimeS: num('stopTimeS'),
});

const ReachOverBody = z.object({ hazardHeightMm: num('hazardHeightMm'), structureHeightMm: num('structureHeightMm') });
const ReachThroughBody = z.object({
  openingMm: num('openingMm'),
  shape: z.enum(MESH_SHAPES, { error: `shape must be one of ${MESH_SHAPES.join(', ')}` }),
});

/** The shared formulas' own errors as HTTP answers: bad input 400 naming the field, a case the standard does not cover 422. */
function answer<T>(f: () => T): T {
  try {
    return f();
  } catch (err) {
    if (err instanceof SafeguardInputError) throw badRequest(err.message, { [err.field]: err.message });
    if (err instanceof NotCoveredError) throw new HttpError(422, 'not_covered', err.message);
    throw err;
  }
}

/** Safeguarding distances (ISO 13855 separation, ISO 13857 reach-over and reach-through): the functions the analysis uses. */
export function safeguardingRouter(): Router {
  const r = Router();

  r.post('/safeguarding/separation', allow('safeguarding.use'), (req, res) => {
    const body = parseOr400(SeparationBody, req.body);
    const s = answer(() => separationDistance(body));
    res.json({ sMm: s.sMm, kMmPerS: s.kMmPerS, cMm: s.cMm, tS: s.tS, formula: s.formula });
  });

  r.post('/safeguarding/reach-over', allow('safeguarding.use'), (req, res) => {
    const body = parseOr400(ReachOverBody, req.body);
    res.json(answer(() => reachOverDistance(body.hazardHeightMm, body.structureHeightMm)));
  });

  r.post('/safeguarding/reach-through', allow('safeguarding.use'), (req, res) => {
    const body = parseOr400(ReachThroughBody, req.body);
    const { distanceMm } = answer(() => reachThroughDistance(body.openingMm, body.shape));
    res.json({ distanceMm });
  });

  return r;
}
