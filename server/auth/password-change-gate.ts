import type { RequestHandler } from 'express';
import { AppError } from '../errors';

/**
 * The API requests a user with a temporary password (set by a fleet manager) may still make: who
 * is signed in (it says the password must change), the form token, the own-password change
 * itself, signing in and out, and the health check. Paths are as the API router sees them.
 */
const ALLOWED = new Set(['GET /auth/me', 'GET /auth/csrf', 'POST /auth/password', 'POST /auth/login', 'POST /auth/logout', 'GET /health']);

/**
 * While the signed-in user's password is a temporary one, every other API request answers 403
 * `password_change_required`, so the account is used only once its owner has chosen a password
 * nobody else knows. Anything not matched exactly (another case, a trailing slash) is refused.
 */
export const passwordChangeGate: RequestHandler = (req, _res, next) => {
  if (!req.user?.mustChangePassword || ALLOWED.has(`${req.method} ${req.path}`)) return next();
  next(new AppError(403, 'password_change_required', 'Your password was set by a fleet manager. Choose a new password of your own before carrying on.'));
};
