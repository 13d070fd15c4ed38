import type { Request } from 'express';
import type { FeatureContext } from '../featureContext';
import { publicBaseUrl } from '../http/hosts';
import type { MailContext } from './reviewMail';

/** The mail context of a request: links from PUBLIC_URL or the listen address, never the request's Host. */
export function mailContextFor(ctx: Pick<FeatureContext, 'config' | 'mailer'>, req: Request): MailContext {
  const base = publicBaseUrl(ctx.config, req);
  return { mailer: ctx.mailer, baseUrl: base.replace(/\/+$/, '') };
}
