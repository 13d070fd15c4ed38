import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { UserCreateInput, UserUpdateInput } from '@shared/schemas/user';
import { allow, currentUser } from '../auth/guards';
import { forgetCachedUser, hashPassword } from '../auth/passport';
import { badRequest, conflict, notFound } from '../http/errors';
import { idParam, parseOr400 } from '../http/validate';
import { User, presentUser } from '../models';
import { audit } from '../services/audit/audit';

/** Users: admins manage; planners may list (to add project members). */
export function usersRouter(sequelize: Sequelize, opts: { bcryptCost: number }): Router {
  const r = Router();

  r.get('/users', allow('user.list'), async (_req, res) => {
    const users = await User.findAll({ order: [['name', 'ASC']] });
    res.json({ users: users.map(presentUser) });
  });

  r.post('/users', allow('user.manage'), async (req, res) => {
    const actor = currentUser(req);
    const input = parseOr400(UserCreateInput, req.body, 'The user');
    if (await User.findOne({ where: { email: input.email } })) {
      throw conflict(`A user with the e-mail ${input.email} already exists.`);
    }
    const passwordHash = await hashPassword(input.password, opts.bcryptCost);
    const user = await sequelize.transaction(async (transaction) => {
      const u = await User.create({ email: input.email, name: input.name, role: input.role, passwordHash }, { transaction });
      await audit(actor.id, 'user.create', 'user', u.id, { email: u.email, role: u.role }, transaction);
      return u;
    });
    res.status(201).json({ user: presentUser(user) });
  });

  r.patch('/users/:id', allow('user.manage'), async (req, res) => {
    const actor = currentUser(req);
    const user = await User.findByPk(idParam(req.params.id, 'User'));
    if (!user) throw notFound('User');
    const input = parseOr400(UserUpdateInput, req.body, 'The user');
    if (user.id === actor.id && (input.active === false || (input.role && input.role !== 'admin'))) {
      throw badRequest('You cannot deactivate yourself or remove your own admin role.', {
        [input.active === false ? 'active' : 'role']: 'Ask another admin to do this',
      });
    }
    const changes: Partial<User> = {};
    if (input.name !== undefined) changes.name = input.name;
    if (input.role !== undefined) changes.role = input.role;
    if (input.active !== undefined) changes.active = input.active;
    if (input.password !== undefined) changes.passwordHash = await hashPassword(input.password, opts.bcryptCost);
    await sequelize.transaction(async (transaction) => {
      await user.update(changes, { transaction });
      // A deactivated user, or one whose password or role changed, loses every open session.
      if (input.active === false || input.password !== undefined || input.role !== undefined) {
        await sequelize.query(`DELETE FROM "session" WHERE (sess->'passport'->>'user') = :id`, {
          replacements: { id: String(user.id) },
          type: QueryTypes.DELETE,
          transaction,
        });
      }
      const fields = Object.keys(input).filter((k) => k !== 'password');
      await audit(actor.id, 'user.update', 'user', user.id, { fields, passwordChanged: input.password !== undefined }, transaction);
    });
    forgetCachedUser(user.id);
    res.json({ user: presentUser(user) });
  });

  return r;
}
