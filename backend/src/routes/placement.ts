import { Router } from 'express';
import { PlacementSearchInput } from '@shared/schemas/placement';
import { allow, currentUser } from '../auth/guards';
import { idParam, parseOr400 } from '../http/validate';
import { loadVisibleLayout } from '../services/layouts';
import { searchPlacement } from '../services/placementSearch';

/** Placement search on a layout: where one arm may stand for chosen work points (reads only; same code as the editor's worker). */
export function placementRouter(): Router {
  const r = Router();
  r.post('/layouts/:id/placement-search', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    const input = parseOr400(PlacementSearchInput, req.body, 'The placement search');
    res.json(await searchPlacement(layout, input));
  });
  return r;
}
