import { Router } from 'express';
import { FenceProposalRequest } from '@shared/schemas/fenceProposal';
import { allow, currentUser } from '../auth/guards';
import { idParam, parseOr400 } from '../http/validate';
import { proposeLayoutFence } from '../services/fenceProposal';
import { loadVisibleLayout } from '../services/layouts';

/** Guard-ring proposals: fences, doors and their bill of materials for a layout (nothing is stored). */
export function fenceProposalsRouter(): Router {
  const r = Router();

  r.post('/layouts/:id/fence-proposal', allow('layout.write'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    const { content, ...system } = parseOr400(FenceProposalRequest, req.body, 'The fence system');
    const p = await proposeLayoutFence(layout, system, content);
    res.json({ boundaries: p.boundaries, bom: p.bom, lengthMm: p.lengthMm, areaEnclosedM2: p.areaEnclosedM2, notes: p.notes, rings: p.rings, required: p.required, parts: p.parts, system: p.system });
  });

  return r;
}
