import { Router } from 'express';
import { Op, UniqueConstraintError, type Sequelize, type Transaction } from 'sequelize';
import { allow, currentUser } from '../auth/guards';
import { conflict, HttpError, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { ArmModel } from '../models';
import { ArmModelInput, layoutsUsingArmModel, presentArmModel, reachSummaryInPool } from '../services/armModels';
import { audit } from '../services/audit/audit';

async function loadArmModel(id: number, transaction?: Transaction): Promise<ArmModel> {
  const m = await ArmModel.findByPk(id, { transaction, lock: transaction ? transaction.LOCK.UPDATE : undefined });
  if (!m) throw notFound('Arm model');
  return m;
}

function builtInReadOnly(m: ArmModel) {
  return new HttpError(409, 'built_in', `"${m.name}" is a built-in model and cannot be changed or deleted. Duplicate it to edit a copy of your own.`);
}

const nameTaken = (name: string) =>
  new HttpError(409, 'name_taken', `An arm model named "${name}" already exists. Choose another name.`, { name: 'Another arm model already has this name' });

/** 409 when another model already has the name (names are unique regardless of letter case). */
async function assertNameFree(name: string, exceptId: number | null, transaction: Transaction) {
  const where = exceptId == null ? { name: { [Op.iLike]: name } } : { name: { [Op.iLike]: name }, id: { [Op.ne]: exceptId } };
  // iLike treats _ and % as wildcards: compare the candidates exactly after the search.
  const candidates = await ArmModel.findAll({ where, attributes: ['id', 'name'], transaction });
  if (candidates.some((c) => c.name.toLowerCase() === name.toLowerCase())) {
    throw nameTaken(name);
  }
}

async function withUniqueName<T>(name: string, fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw nameTaken(name);
    throw err;
  }
}

/** The arm catalogue: read by every signed-in role, written by planners and admins; built-ins are read-only. */
export function armModelsRouter(sequelize: Sequelize): Router {
  const r = Router();

  r.get('/arm-models', allow('armModel.read'), async (_req, res) => {
    const models = await ArmModel.findAll({ order: [['builtIn', 'DESC'], ['name', 'ASC']] });
    res.json({ armModels: models.map(presentArmModel) });
  });

  r.get('/arm-models/:id', allow('armModel.read'), async (req, res) => {
    const m = await loadArmModel(idParam(req.params.id, 'Arm model'));
    res.json({ armModel: presentArmModel(m) });
  });

  r.post('/arm-models', allow('armModel.write'), async (req, res) => {
    const user = currentUser(req);
    const input = parseOr400(ArmModelInput, req.body, 'The arm model');
    const reachSummary = await reachSummaryInPool(input.params);
    const created = await withUniqueName(input.name, () =>
      sequelize.transaction(async (transaction) => {
        await assertNameFree(input.name, null, transaction);
        const m = await ArmModel.create({ name: input.name, family: input.params.family, params: input.params, reachSummary, builtIn: false, createdBy: user.id }, { transaction });
        await audit(user.id, 'armModel.create', 'armModel', m.id, { name: m.name, family: m.family }, transaction);
        return m;
      }),
    );
    res.status(201).json({ armModel: presentArmModel(created) });
  });

  r.put('/arm-models/:id', allow('armModel.write'), async (req, res) => {
    const user = currentUser(req);
    const id = idParam(req.params.id, 'Arm model');
    const existing = await loadArmModel(id);
    if (existing.builtIn) throw builtInReadOnly(existing);
    const input = parseOr400(ArmModelInput, req.body, 'The arm model');
    const reachSummary = await reachSummaryInPool(input.params);
    const updated = await withUniqueName(input.name, () =>
      sequelize.transaction(async (transaction) => {
        const m = await loadArmModel(id, transaction);
        if (m.builtIn) throw builtInReadOnly(m);
        await assertNameFree(input.name, m.id, transaction);
        const before = { name: m.name, family: m.family };
        await m.update({ name: input.name, family: input.params.family, params: input.params, reachSummary }, { transaction });
        await audit(user.id, 'armModel.update', 'armModel', m.id, { before, name: m.name, family: m.family }, transaction);
        return m;
      }),
    );
    res.json({ armModel: presentArmModel(updated) });
  });

  r.delete('/arm-models/:id', allow('armModel.write'), async (req, res) => {
    const user = currentUser(req);
    const id = idParam(req.params.id, 'Arm model');
    await sequelize.transaction(async (transaction) => {
      const m = await loadArmModel(id, transaction);
      if (m.builtIn) throw builtInReadOnly(m);
      const users = await layoutsUsingArmModel(sequelize, m.id, transaction);
      if (users.length) {
        const names = users.map((l) => `"${l.name}" (${l.projectName})`).join(', ');
        throw conflict(`"${m.name}" is placed in ${users.length === 1 ? 'the cell layout' : 'the cell layouts'} ${names}; remove it from ${users.length === 1 ? 'that cell layout' : 'those cell layouts'} first.`, {
          layouts: users,
        });
      }
      await audit(user.id, 'armModel.delete', 'armModel', m.id, { name: m.name, family: m.family }, transaction);
      await m.destroy({ transaction });
    });
    res.status(204).end();
  });

  return r;
}
