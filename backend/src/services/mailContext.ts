import type { Request } from 'express';
import type { FeatureContext } from '../featureContext';
import type { MailContext } from './reviewMail';

/** The mail context of a request: the configured public URL, or the request's own origin. */
export function mailContextFor(ctx: Pick<FeatureContext, 'config' | 'mailer'>, req: Request): MailContext {
  const base = ctx.config.publicUrl ?? `${req.protocol}://${req.get('host') ?? '127.0.0.1'}`;
  return { mailer: ctx.mailer, baseUrl: base.replace(/\/+$/, '') };
}
