import { Router, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import type { InferAttributes, Sequelize } from 'sequelize';
import { checkDrawingUnit } from '@shared/geometry';
import { FloorPlanPatch, SavedLayerRoles, type SavedLayerRole, type UnitName } from '@shared/schemas/floorPlan';
import type { SessionUser } from '../auth/passport';
import { allow, currentUser } from '../auth/guards';
import { badRequest, conflict, HttpError, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { FloorPlan, Layout, ProjectLayerRoles } from '../models';
import { audit } from '../services/audit/audit';
import { isDxfImportError } from '../services/dxf/errors';
import { readFloorPlan, storedGeometry, type ReadFloorPlan } from '../services/floorPlanImport';
import { loadVisibleProject } from '../services/projectAccess';

const SUMMARY_ATTRS = ['id', 'projectId', 'fileName', 'units', 'unitsSource', 'bounds', 'layers', 'warnings', 'stats', 'origin', 'notes', 'createdAt', 'updatedAt'] as const;
/** What an upload's INSERT returns: never the geometry (stored as text, see storedGeometry) nor the file. */
const CREATE_RETURNING: Array<keyof InferAttributes<FloorPlan>> = [...SUMMARY_ATTRS, 'createdBy'];

function summary(fp: FloorPlan) {
  return {
    id: fp.id,
    projectId: fp.projectId,
    fileName: fp.fileName,
    units: fp.units,
    unitsSource: fp.unitsSource,
    bounds: fp.bounds,
    layers: fp.layers,
    warnings: fp.warnings,
    notes: fp.notes,
    stats: fp.stats,
    origin: fp.origin,
    // recomputed from what is stored, so a unit chosen later is checked too
    unitCheck: checkDrawingUnit(fp.bounds, fp.units as UnitName),
    createdAt: fp.createdAt.toISOString(),
    updatedAt: fp.updatedAt.toISOString(),
  };
}

/** Maps an import failure to the HTTP answer: 415 for files that are not ASCII DXF, else 400. */
function importFailure(err: unknown): never {
  if (isDxfImportError(err)) {
    const e = err as { code: string; message: string; line?: number };
    const status = e.code === 'not-dxf' || e.code === 'binary-dxf' ? 415 : e.code === 'timeout' || e.code === 'internal' ? 422 : 400;
    const where = e.line && !/\bline \d+/.test(e.message) ? ` (line ${e.line})` : '';
    throw new HttpError(status, `dxf_${e.code.replace(/-/g, '_')}`, `${e.message}${where}`, undefined, e.line ? { line: e.line } : undefined);
  }
  throw err;
}

async function loadVisiblePlan(user: SessionUser, id: number, withGeometry: boolean): Promise<FloorPlan> {
  const fp = await FloorPlan.findByPk(id, { attributes: withGeometry ? [...SUMMARY_ATTRS, 'geometry'] : [...SUMMARY_ATTRS] });
  if (!fp) throw notFound('Floor plan');
  await loadVisibleProject(user, fp.projectId).catch(() => {
    throw notFound('Floor plan');
  });
  return fp;
}

/** Seconds a client is asked to wait when every import slot is taken. */
const IMPORT_RETRY_AFTER_S = 5;

/**
 * At most `limit` DXF imports at once in this server: each holds up to a worker thread and its
 * heap, so more would only queue memory. `take` answers 429 with Retry-After when all are taken.
 */
function importSlots(limit: number) {
  let active = 0;
  return {
    take(res: Response): () => void {
      if (active >= limit) {
        res.set('Retry-After', String(IMPORT_RETRY_AFTER_S));
        throw new HttpError(
          429,
          'imports_busy',
          `${limit === 1 ? 'A drawing is' : `${limit} drawings are`} being read on this server right now, the most it reads at once; try again in ${IMPORT_RETRY_AFTER_S} seconds.`,
        );
      }
      active++;
      let done = false;
      return () => {
        if (!done) active--;
        done = true;
      };
    },
  };
}

/** Carries roles and heights the planner set over to a re-read of the same drawing. */
function keepLayerChoices(result: ReadFloorPlan, previous: FloorPlan['layers']): ReadFloorPlan['layers'] {
  const byName = new Map(previous.map((l) => [l.name, l]));
  return result.layers.map((l) => {
    const old = byName.get(l.name);
    return old ? { ...l, role: old.role, height: old.height } : l;
  });
}

/** What is stored of an import besides the layers (the geometry as its JSON text). */
function storedImport(sequelize: Sequelize, result: ReadFloorPlan) {
  return {
    units: result.units,
    unitsSource: result.unitsSource,
    bounds: result.bounds,
    geometry: storedGeometry(sequelize, result.geometryJson),
    warnings: result.warnings,
    notes: result.notes,
    origin: result.origin,
    stats: { ...result.stats, chordToleranceMm: result.chordToleranceMm, insunits: result.insunits, gaps: result.gaps },
  };
}

/** Applies a project's saved layer roles (names matched ignoring case); returns how many layers took one. */
function applySavedRoles(result: ReadFloorPlan, saved: readonly SavedLayerRole[]): number {
  const byName = new Map(saved.map((l) => [l.name.toLowerCase(), l]));
  let n = 0;
  result.layers = result.layers.map((l) => {
    const s = byName.get(l.name.toLowerCase());
    if (!s) return l;
    n++;
    return { ...l, role: s.role, height: s.height };
  });
  return n;
}

/** Floor plans: DXF upload (multer, in memory, size-capped), read, layer roles and units, source, delete. */
export function floorPlansRouter(sequelize: Sequelize, opts: { uploadLimitBytes: number; importConcurrency?: number }): Router {
  const r = Router();
  const imports = importSlots(opts.importConcurrency ?? 2);
  const capMb = Math.round((opts.uploadLimitBytes / 1024 / 1024) * 10) / 10;
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: opts.uploadLimitBytes, files: 1, fields: 10 } });
  const singleFile: RequestHandler = (req, res, next) => {
    upload.single('file')(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `The file is larger than the upload limit of ${capMb} MB.`));
        if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(badRequest(`Send the drawing in the form field "file" (got "${err.field}").`, { file: 'Choose a DXF file' }));
        return next(badRequest(`The upload could not be read: ${err.message}.`));
      }
      next(err);
    });
  };

  r.get('/projects/:id/floor-plans', allow('floorPlan.read'), async (req, res) => {
    const project = await loadVisibleProject(currentUser(req), idParam(req.params.id, 'Project'));
    const plans = await FloorPlan.findAll({ where: { projectId: project.id }, attributes: [...SUMMARY_ATTRS], order: [['createdAt', 'DESC']] });
    res.json({ floorPlans: plans.map(summary) });
  });

  r.post('/projects/:id/floor-plans', allow('floorPlan.write'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    let result: ReadFloorPlan;
    const release = imports.take(res);
    try {
      await new Promise<void>((resolve, reject) => singleFile(req, res, (e?: unknown) => (e ? reject(e) : resolve())));
      if (!req.file) throw badRequest('Choose a DXF file to upload (form field "file").', { file: 'Choose a DXF file' });
      if (req.file.size === 0) throw badRequest('The file is empty.', { file: 'The file is empty' });
      try {
        result = await readFloorPlan(req.file.buffer);
      } catch (err) {
        importFailure(err);
      }
    } finally {
      release();
    }
    const file = req.file;
    const fileName = (file.originalname || 'floor-plan.dxf').slice(0, 255);
    const saved = await ProjectLayerRoles.findByPk(project.id);
    if (saved) {
      const n = applySavedRoles(result, saved.layers);
      if (n > 0) result.warnings.push(`${n === 1 ? 'One layer takes its role' : `${n} layers take their roles`} from the roles saved for this project.`);
    }
    const fp = await sequelize.transaction(async (transaction) => {
      const row = await FloorPlan.create(
        {
          projectId: project.id,
          fileName,
          originalDxf: file.buffer,
          ...storedImport(sequelize, result),
          layers: result.layers,
          createdBy: user.id,
        },
        { transaction, returning: CREATE_RETURNING },
      );
      await audit(user.id, 'floorPlan.create', 'floorPlan', row.id, { projectId: project.id, fileName, bytes: file.size }, transaction);
      return row;
    });
    res.status(201).json(summary(fp));
  });

  r.get('/floor-plans/:id', allow('floorPlan.read'), async (req, res) => {
    const fp = await loadVisiblePlan(currentUser(req), idParam(req.params.id, 'Floor plan'), true);
    res.json({ ...summary(fp), geometry: fp.geometry });
  });

  r.patch('/floor-plans/:id', allow('floorPlan.write'), async (req, res) => {
    const user = currentUser(req);
    const id = idParam(req.params.id, 'Floor plan');
    await loadVisiblePlan(user, id, false);
    const patch = parseOr400(FloorPlanPatch, req.body, 'The floor plan change');
    const updated = await sequelize.transaction(async (transaction) => {
      const fp = await FloorPlan.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!fp) throw notFound('Floor plan');
      const changes: Partial<FloorPlan> = {};
      let layers = fp.layers;
      if (patch.units && patch.units !== fp.units) {
        // Re-read the stored original in the chosen unit: geometry rescaled exactly, no re-upload.
        let result: ReadFloorPlan;
        const release = imports.take(res);
        try {
          result = await readFloorPlan(fp.originalDxf, { units: patch.units });
        } catch (err) {
          importFailure(err);
        } finally {
          release();
        }
        layers = keepLayerChoices(result, fp.layers);
        Object.assign(changes, { ...storedImport(sequelize, result), unitsSource: 'chosen' });
      }
      if (patch.layers) {
        const byName = new Map(layers.map((l) => [l.name, l]));
        const fields: Record<string, string> = {};
        patch.layers.forEach((p, i) => {
          if (!byName.has(p.name)) fields[`layers.${i}.name`] = `No layer named "${p.name}" in this drawing`;
        });
        if (Object.keys(fields).length) throw badRequest(`The change names a layer the drawing does not have.`, fields);
        layers = layers.map((l) => {
          const p = patch.layers!.find((x) => x.name === l.name);
          return p ? { ...l, ...(p.role !== undefined ? { role: p.role } : {}), ...(p.height !== undefined ? { height: p.height } : {}) } : l;
        });
      }
      changes.layers = layers;
      await fp.update(changes, { transaction });
      await audit(user.id, 'floorPlan.update', 'floorPlan', fp.id, { units: patch.units, layers: patch.layers?.map((l) => l.name) }, transaction);
      return fp;
    });
    const fresh = await FloorPlan.findByPk(updated.id, { attributes: [...SUMMARY_ATTRS, 'geometry'] });
    res.json({ ...summary(fresh!), geometry: fresh!.geometry });
  });

  r.get('/projects/:id/layer-roles', allow('floorPlan.read'), async (req, res) => {
    const project = await loadVisibleProject(currentUser(req), idParam(req.params.id, 'Project'));
    const saved = await ProjectLayerRoles.findByPk(project.id);
    res.json({ layers: saved?.layers ?? [], updatedAt: saved ? saved.updatedAt.toISOString() : null });
  });

  // Saves layer roles for the project's next uploads (replacing what was saved before).
  r.put('/projects/:id/layer-roles', allow('floorPlan.write'), async (req, res) => {
    const user = currentUser(req);
    const project = await loadVisibleProject(user, idParam(req.params.id, 'Project'));
    const body = parseOr400(SavedLayerRoles, req.body, 'The saved layer roles');
    const row = await sequelize.transaction(async (transaction) => {
      const [saved] = await ProjectLayerRoles.upsert({ projectId: project.id, layers: body.layers, updatedBy: user.id }, { transaction, returning: true });
      await audit(user.id, 'project.layerRoles', 'project', project.id, { layers: body.layers.length }, transaction);
      return saved;
    });
    res.json({ layers: row.layers, updatedAt: row.updatedAt.toISOString() });
  });

  r.get('/floor-plans/:id/source', allow('floorPlan.read'), async (req, res) => {
    const id = idParam(req.params.id, 'Floor plan');
    await loadVisiblePlan(currentUser(req), id, false);
    const fp = await FloorPlan.findByPk(id, { attributes: ['id', 'fileName', 'originalDxf'] });
    res.set('Content-Type', 'application/dxf');
    res.attachment(fp!.fileName);
    res.send(fp!.originalDxf);
  });

  r.delete('/floor-plans/:id', allow('floorPlan.write'), async (req, res) => {
    const user = currentUser(req);
    const fp = await loadVisiblePlan(user, idParam(req.params.id, 'Floor plan'), false);
    const users = await Layout.findAll({ where: { floorPlanId: fp.id }, attributes: ['id', 'name'] });
    if (users.length) {
      throw conflict(`This floor plan is used by ${users.length === 1 ? 'the cell layout' : 'the cell layouts'} ${users.map((l) => `"${l.name}"`).join(', ')}; move or delete ${users.length === 1 ? 'it' : 'them'} first.`, {
        layouts: users.map((l) => ({ id: l.id, name: l.name })),
      });
    }
    await sequelize.transaction(async (transaction) => {
      await audit(user.id, 'floorPlan.delete', 'floorPlan', fp.id, { fileName: fp.fileName }, transaction);
      await FloorPlan.destroy({ where: { id: fp.id }, transaction });
    });
    res.status(204).end();
  });

  return r;
}
