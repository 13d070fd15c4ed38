import type { RequestHandler } from 'express';
import { can, type Action } from '@shared/policy';
import { forbidden, unauthorized } from '../http/errors';
import type { SessionUser } from './passport';

/** Passes signed-in requests; 401 otherwise. */
export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(unauthorized());
  next();
};

/** Passes when the signed-in user's role may perform the action (shared/policy.ts); 401/403 otherwise. */
export function allow(action: Action): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(unauthorized());
    if (!can(req.user.role, action)) return next(forbidden());
    next();
  };
}

/** The signed-in user of a request that went through requireUser/allow. */
export function currentUser(req: { user?: SessionUser }): SessionUser {
  if (!req.user) throw unauthorized();
  return req.user;
}
