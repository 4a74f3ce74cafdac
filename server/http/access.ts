import type { RequestHandler, Request } from 'express';
import { AppError } from '../errors';
import type { Role, SessionUser } from '../contracts/users';

export type { SessionUser } from '../contracts/users';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

/**
 * Lets the request through only for a signed-in user with one of `roles`: 401 without a session,
 * 403 for another role. Every API route states its roles with this, so access is decided on the
 * server and listed in one place per route.
 */
export function allow(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.user) return next(AppError.unauthorized());
    if (!roles.includes(req.user.role)) return next(AppError.forbidden());
    next();
  };
}

/** The routes anyone may call (sign-in, health). Marked so the role-access test can tell. */
export const open: RequestHandler = (_req, _res, next) => next();

export function currentUser(req: Request): SessionUser {
  if (!req.user) throw AppError.unauthorized();
  return req.user;
}
