import { Router } from 'express';
import { simpleParser } from 'mailparser';
import { allow } from '../auth/guards';
import { notFound } from '../http/errors';
import { idParam } from '../http/validate';
import { MailMessage } from '../models';

const PAGE = 50;

/** The mail outbox of the local mail fake (admin): list, one message, its attachments. */
export function adminMailRouter(): Router {
  const r = Router();

  r.get('/admin/mail', allow('mail.read'), async (req, res) => {
    const page = Math.max(1, Number.parseInt(String(req.query.page ?? '1'), 10) || 1);
    const { rows, count } = await MailMessage.findAndCountAll({
      attributes: ['id', 'from', 'to', 'subject', 'attachments', 'at'],
      order: [['at', 'DESC'], ['id', 'DESC']],
      limit: PAGE,
      offset: (page - 1) * PAGE,
    });
    res.json({
      messages: rows.map((m) => ({ id: m.id, from: m.from, to: m.to, subject: m.subject, at: m.at.toISOString(), attachments: m.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.size })) })),
      page,
      pageSize: PAGE,
      total: count,
    });
  });

  r.get('/admin/mail/:id', allow('mail.read'), async (req, res) => {
    const m = await MailMessage.findByPk(idParam(req.params.id, 'Message'), { attributes: { exclude: ['raw'] } });
    if (!m) throw notFound('Message');
    res.json({ message: { id: m.id, from: m.from, to: m.to, subject: m.subject, text: m.text, at: m.at.toISOString(), attachments: m.attachments } });
  });

  r.get('/admin/mail/:id/attachments/:n', allow('mail.read'), async (req, res) => {
    const m = await MailMessage.findByPk(idParam(req.params.id, 'Message'));
    if (!m) throw notFound('Message');
    const n = Number(req.params.n);
    const parsed = await simpleParser(m.raw);
    const a = Number.isInteger(n) && n >= 0 ? parsed.attachments[n] : undefined;
    if (!a) throw notFound('Attachment');
    const name = (a.filename ?? `attachment-${n}`).replace(/[^A-Za-z0-9._-]+/g, '-');
    res.set('Content-Type', a.contentType || 'application/octet-stream');
    res.set('Content-Disposition', `attachment; filename="${name}"`);
    res.send(a.content);
  });

  return r;
}
