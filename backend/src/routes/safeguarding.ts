import { Router } from 'express';
import { z } from 'zod';
import { NotCoveredError, SAFEGUARD_DEVICES, SafeguardInputError, MESH_SHAPES, reachOverDistance, reachThroughDistance, separationDistance } from '@shared/safety';
import { allow } from '../auth/guards';
import { HttpError, badRequest } from '../http/errors';
import { parseOr400 } from '../http/validate';

// zod's number refuses NaN and ±Infinity; labels and units of the messages come from shared/schemas/labels.ts.
const num = () => z.number();

const SeparationBody = z.object({
  device: z.enum(SAFEGUARD_DEVICES),
  resolutionMm: num().optional(),
  beams: num().optional(),
  approach: z.enum(['normal', 'parallel']).optional(),
  heightMm: num().optional(),
  responseTimeS: num(),
  stopTimeS: num(),
});

const ReachOverBody = z.object({ hazardHeightMm: num(), structureHeightMm: num() });
const ReachThroughBody = z.object({
  openingMm: num(),
  shape: z.enum(MESH_SHAPES),
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
