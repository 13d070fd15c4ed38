import { Router } from 'express';
import { allow, currentUser } from '../auth/guards';
import { badRequest } from '../http/errors';
import { idParam } from '../http/validate';
import { loadVisibleLayout } from '../services/layouts';
import { renderPlanSheetInPool } from '../services/planSheet/renderInPool';
import { layoutDxf, loadLayoutSheetInput, SCALE_SERIES, SHEET_KINDS, SHEET_SIZES, type PlanSheetOptions, type SheetKind, type SheetScale, type SheetSize } from '../services/planSheet';

const one = (v: unknown, name: string): string | undefined => {
  if (v === undefined) return undefined;
  if (typeof v !== 'string') throw badRequest(`Give ${name} once.`, { [name]: `Give ${name} once` });
  return v;
};

/** Reads size, scale and sheets from the query string (400 naming the option when one is bad). */
function planSheetQuery(q: Record<string, unknown>): Pick<PlanSheetOptions, 'size' | 'scale' | 'sheets'> {
  const size = (one(q.size, 'size') ?? 'A3').toUpperCase();
  if (!(SHEET_SIZES as readonly string[]).includes(size)) throw badRequest(`size must be one of ${SHEET_SIZES.join(', ')}.`, { size: `Use one of ${SHEET_SIZES.join(', ')}` });
  const rawScale = one(q.scale, 'scale');
  let scale: SheetScale | undefined;
  if (rawScale !== undefined && rawScale !== 'auto') {
    const n = Number(rawScale.replace(/^1:/, ''));
    if (!(SCALE_SERIES as readonly number[]).includes(n)) throw badRequest(`scale must be auto or one of ${SCALE_SERIES.join(', ')}.`, { scale: `Use auto or one of ${SCALE_SERIES.join(', ')}` });
    scale = n as SheetScale;
  }
  const rawSheets = one(q.sheets, 'sheets');
  let sheets: SheetKind[] | undefined;
  if (rawSheets !== undefined) {
    const list = rawSheets.split(',').map((s) => s.trim()).filter(Boolean);
    const bad = list.find((s) => !(SHEET_KINDS as readonly string[]).includes(s));
    if (bad !== undefined || !list.length) {
      throw badRequest(`sheets must list some of ${SHEET_KINDS.join(', ')}${bad ? ` (not "${bad}")` : ''}.`, { sheets: `Use some of ${SHEET_KINDS.join(', ')}` });
    }
    sheets = list as SheetKind[];
  }
  return { size: size as SheetSize, scale, sheets };
}

const fileBase = (name: string) => name.replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 80) || 'layout';

/** Plan sheet PDF (draft mark) and DXF export of a layout's working copy. */
export function planSheetsRouter(): Router {
  const r = Router();

  r.get('/layouts/:id/plan-sheet.pdf', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    const opts = planSheetQuery(req.query as Record<string, unknown>);
    const input = await loadLayoutSheetInput(layout);
    const pdf = await renderPlanSheetInPool(input, { ...opts, draft: true, createdAt: new Date() });
    res.set('Content-Type', 'application/pdf');
    res.set('Content-Disposition', `inline; filename="${fileBase(layout.name)}-working-copy.pdf"`);
    res.set('Cache-Control', 'no-store');
    res.send(pdf);
  });

  r.get('/layouts/:id/layout.dxf', allow('layout.read'), async (req, res) => {
    const layout = await loadVisibleLayout(currentUser(req), idParam(req.params.id, 'Layout'));
    const input = await loadLayoutSheetInput(layout);
    res.set('Content-Type', 'application/dxf');
    res.set('Content-Disposition', `attachment; filename="${fileBase(layout.name)}.dxf"`);
    res.set('Cache-Control', 'no-store');
    res.send(layoutDxf(input, { createdAt: new Date() }));
  });

  return r;
}
