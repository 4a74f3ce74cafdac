import type { Router, Request, RequestHandler } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { Sequelize } from 'sequelize';
import { DatabaseLimitStore } from './limit-store';
import { z } from 'zod';
import { AppError } from '../errors';
import { allow, currentUser, open, type SessionUser } from '../http/access';
import { parse } from '../http/validate';
import { accountDelay, type AccountDelayOptions } from './account-delay';
import { userRepository } from '../users/repository';
import { PASSWORD_MAX_BYTES, passwordSchema } from '../users/routes';
import { userService } from '../users/service';

/** The sign-in policy; stated in the README ("Sign-in and sessions"). */
export interface AuthOptions {
  /** Failed sign-ins allowed per account and address pair, and per address, in `loginWindowMs`. */
  loginLimitPerPair: number;
  loginLimitPerAddress: number;
  loginWindowMs: number;
  /** The growing per-account spacing (server/auth/account-delay.ts). */
  accountDelay: Omit<AccountDelayOptions, 'windowMs'>;
}

export const defaultAuthOptions: AuthOptions = {
  loginLimitPerPair: 8,
  loginLimitPerAddress: 30,
  loginWindowMs: 15 * 60 * 1000,
  accountDelay: { freeFailures: 5, baseDelayMs: 1000, maxDelayMs: 8000, maxWaitMs: 10_000 },
};

export function configurePassport() {
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      userService.verify(email, password).then(
        (u) => done(null, u ?? false),
        (err) => done(err),
      );
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser((id: number, done) => {
    userRepository.findById(id).then(
      (u) =>
        done(null, u && u.active ? { id: u.id, name: u.name, email: u.email, role: u.role, active: u.active, mustChangePassword: u.mustChangePassword } : false),
      (err) => done(err),
    );
  });
}

const loginSchema = z
  .object({
    email: z.email({ message: 'must be an e-mail address' }).max(254),
    // longer passwords are refused when set (bcrypt reads 72 bytes); one sent here could only
    // match by its first 72 bytes, so it is refused rather than cut
    password: z
      .string()
      .min(1, 'is required')
      .refine((p) => Buffer.byteLength(p, 'utf8') <= PASSWORD_MAX_BYTES, { message: `must be at most ${PASSWORD_MAX_BYTES} bytes` }),
  })
  .strict();

const passwordChangeSchema = z
  .object({ currentPassword: z.string().min(1, 'is required').max(200), newPassword: passwordSchema })
  .strict();

const limited = (message: string) => (_req: Request, _res: unknown, next: (e: unknown) => void) =>
  next(new AppError(429, 'too_many_attempts', message));

export function registerAuthRoutes(r: Router, deps: { csrfToken: (req: Request, res: import('express').Response) => string; options: AuthOptions; sequelize: Sequelize }) {
  const { options } = deps;
  // failure counts in the database, shared by every app instance on it (limit-store.ts)
  const addressCounts = new DatabaseLimitStore(() => deps.sequelize, 'sign-in address/');
  const pairCounts = new DatabaseLimitStore(() => deps.sequelize, 'sign-in pair/');
  const byAddress = rateLimit({
    windowMs: options.loginWindowMs,
    limit: options.loginLimitPerAddress,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    store: addressCounts,
    handler: limited('Too many sign-in attempts from this address. Wait a few minutes and try again.'),
  });
  const accountOf = (req: Request) => String((req.body as { email?: unknown })?.email ?? '').toLowerCase().trim();
  // a pair limit, not an account limit: failures from one address cannot lock the account's owner out elsewhere
  const byPair = rateLimit({
    windowMs: options.loginWindowMs,
    limit: options.loginLimitPerPair,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `pair:${accountOf(req)}|${ipKeyGenerator(req.ip ?? 'unknown')}`,
    store: pairCounts,
    handler: limited('Too many failed sign-ins for this account from this address. Wait a few minutes and try again.'),
  });
  // the per-account spacing, also in the database (account-delay.ts)
  const delay = accountDelay(() => deps.sequelize, { ...options.accountDelay, windowMs: options.loginWindowMs });
  setInterval(() => {
    // ended windows' rows; a failure here (the database closing at shutdown) only delays it
    delay.sweep().catch(() => undefined);
    addressCounts.sweep().catch(() => undefined);
  }, 60_000).unref();
  const byAccount: RequestHandler = (req, res, next) => {
    delay.reserve(accountOf(req)).then((turn) => {
      if ('retryAfterMs' in turn) {
        res.setHeader('retry-after', String(Math.ceil(turn.retryAfterMs / 1000)));
        return next(new AppError(429, 'too_many_attempts', `This account has had many failed sign-ins just now; try again in ${Math.ceil(turn.retryAfterMs / 1000)} s.`));
      }
      if (turn.waitMs === 0) return next();
      setTimeout(next, turn.waitMs);
    }, next);
  };

  const validateLogin: RequestHandler = (req, _res, next) => {
    parse(loginSchema, req.body, 'sign-in form');
    next();
  };

  r.get('/auth/csrf', open, (req, res) => {
    // Stores nothing for an anonymous visitor: its token is bound to a cookie of its own (server/app.ts).
    res.json({ token: deps.csrfToken(req, res) });
  });

  r.post('/auth/login', open, validateLogin, byAddress, byPair, byAccount, (req, res, next) => {
    passport.authenticate('local', (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) {
        // counted before the answer, so the next attempt (on any instance) already waits for it
        return delay.failed(accountOf(req)).then(() => next(new AppError(401, 'invalid_credentials', 'That e-mail and password do not match an active account.')), next);
      }
      delay.succeeded(accountOf(req)).then(
        () =>
          req.login(user, (loginErr) => {
            if (loginErr) return next(loginErr);
            res.json({ user });
          }),
        next,
      );
    })(req, res, next);
  });

  r.post('/auth/logout', open, (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.status(204).end();
      });
    });
  });

  r.get('/auth/me', open, (req, res) => {
    res.json({ user: currentUser(req) });
  });

  r.post('/auth/password', allow('manager', 'mechanic', 'driver'), async (req, res) => {
    const body = parse(passwordChangeSchema, req.body, 'form');
    await userService.changePassword(currentUser(req).id, body.currentPassword, body.newPassword, req.sessionID);
    res.status(204).end();
  });
}
