import { Router } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { allow } from '../auth/guards';
import { parseOr400 } from '../http/validate';
import { AuditEvent, User } from '../models';
import { describeAuditEvents } from '../services/audit/describe';

const AuditQuery = z.object({
  action: z.string().trim().max(60).optional(),
  actor: z.coerce.number().int().positive().optional(),
  entity: z.string().trim().max(40).optional(),
  entityId: z.string().trim().max(40).optional(),
  from: z.coerce.date({ error: 'Give a date' }).optional(),
  to: z.coerce.date({ error: 'Give a date' }).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
});

/** The audit log (admin), newest first, filtered and paginated. */
export function adminAuditRouter(): Router {
  const r = Router();

  r.get('/admin/audit', allow('audit.read'), async (req, res) => {
    const q = parseOr400(AuditQuery, Object.fromEntries(Object.entries(req.query).filter(([, v]) => v !== '')), 'The filter');
    const where: WhereOptions<AuditEvent> = {};
    // `action=revision.` matches every action of that family; otherwise exact.
    if (q.action) Object.assign(where, { action: q.action.endsWith('.') ? { [Op.startsWith]: q.action } : q.action });
    if (q.actor) Object.assign(where, { actorId: q.actor });
    if (q.entity) Object.assign(where, { entity: q.entity });
    if (q.entityId) Object.assign(where, { entityId: q.entityId });
    if (q.from || q.to) Object.assign(where, { at: { ...(q.from ? { [Op.gte]: q.from } : {}), ...(q.to ? { [Op.lte]: q.to } : {}) } });
    const { rows, count } = await AuditEvent.findAndCountAll({ where, order: [['at', 'DESC'], ['id', 'DESC']], limit: q.pageSize, offset: (q.page - 1) * q.pageSize });
    const ids = [...new Set(rows.map((e) => e.actorId).filter((i): i is number => i != null))];
    const names = new Map((ids.length ? await User.findAll({ where: { id: ids }, attributes: ['id', 'name', 'email'] }) : []).map((u) => [u.id, u]));
    const words = await describeAuditEvents(rows.map((e) => ({ action: e.action, entity: e.entity, entityId: e.entityId, details: e.details })));
    // The stored codes stay for filtering; what people read is `words` (shared/audit).
    res.json({
      events: rows.map((e, i) => {
        const u = e.actorId != null ? names.get(e.actorId) : undefined;
        return { id: Number(e.id), at: e.at.toISOString(), action: e.action, entity: e.entity, entityId: e.entityId, actor: e.actorId != null ? { id: e.actorId, name: u?.name ?? 'Former user', email: u?.email ?? '' } : null, words: words[i] };
      }),
      page: q.page,
      pageSize: q.pageSize,
      total: count,
    });
  });

  return r;
}
