import type { Router, Request, RequestHandler } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import { z } from 'zod';
import { AppError } from '../errors';
import { allow, currentUser, open, type SessionUser } from '../http/access';
import { parse } from '../http/validate';
import { userRepository } from '../users/repository';
import { passwordSchema } from '../users/routes';
import { userService } from '../users/service';

export interface AuthOptions {
  /** Failed sign-ins allowed per account, and per address, in `windowMs`. */
  loginLimitPerAccount: number;
  loginLimitPerAddress: number;
  loginWindowMs: number;
}

export const defaultAuthOptions: AuthOptions = {
  loginLimitPerAccount: 8,
  loginLimitPerAddress: 30,
  loginWindowMs: 15 * 60 * 1000,
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
      (u) => done(null, u && u.active ? { id: u.id, name: u.name, email: u.email, role: u.role, active: u.active } : false),
      (err) => done(err),
    );
  });
}

const loginSchema = z
  .object({
    email: z.email({ message: 'must be an e-mail address' }).max(254),
    password: z.string().min(1, 'is required').max(200),
  })
  .strict();

const passwordChangeSchema = z
  .object({ currentPassword: z.string().min(1, 'is required').max(200), newPassword: passwordSchema })
  .strict();

const limited = (message: string) => (_req: Request, _res: unknown, next: (e: unknown) => void) =>
  next(new AppError(429, 'too_many_attempts', message));

export function registerAuthRoutes(r: Router, deps: { csrfToken: (req: Request, res: import('express').Response) => string; options: AuthOptions }) {
  const { options } = deps;
  const byAddress = rateLimit({
    windowMs: options.loginWindowMs,
    limit: options.loginLimitPerAddress,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    handler: limited('Too many sign-in attempts from this address. Wait a few minutes and try again.'),
  });
  const byAccount = rateLimit({
    windowMs: options.loginWindowMs,
    limit: options.loginLimitPerAccount,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `acct:${String((req.body as { email?: unknown })?.email ?? '').toLowerCase().trim()}`,
    handler: limited('Too many failed sign-ins for this account. Wait a few minutes and try again.'),
  });

  const validateLogin: RequestHandler = (req, _res, next) => {
    parse(loginSchema, req.body, 'sign-in form');
    next();
  };

  r.get('/auth/csrf', open, (req, res) => {
    // Touch the session so it is stored and its id (which the token is bound to) stays put.
    (req.session as unknown as { seen?: boolean }).seen = true;
    res.json({ token: deps.csrfToken(req, res) });
  });

  r.post('/auth/login', open, validateLogin, byAddress, byAccount, (req, res, next) => {
    passport.authenticate('local', (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) {
        return next(new AppError(401, 'invalid_credentials', 'That e-mail and password do not match an active account.'));
      }
      req.login(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        res.json({ user });
      });
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
    await userService.changePassword(currentUser(req).id, body.currentPassword, body.newPassword);
    res.status(204).end();
  });
}
