import express, { Router, type Express } from 'express';
import session from 'express-session';
import connectSessionSequelize from 'connect-session-sequelize';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import nocache from 'nocache';
import compression from 'compression';
import expressStaticGzip from 'express-static-gzip';
import passport from 'passport';
import { doubleCsrf } from 'csrf-csrf';
import path from 'node:path';
import fs from 'node:fs';
import { randomBytes } from 'node:crypto';
import type { Config } from './config';
import type { Db } from './db';
import { AppError, errorHandler } from './errors';
import type { Logger } from './logger';
import { configurePassport, defaultAuthOptions, registerAuthRoutes, type AuthOptions } from './auth/routes';
import { passwordChangeGate } from './auth/password-change-gate';
import { registerUserRoutes } from './users/routes';
import { registerFleetRoutes } from './fleet/routes';
import { open } from './http/access';
import { throttleTouch, TOUCH_EVERY_MS } from './http/session-touch';
import { registerFleetWriteRoutes } from './fleet/write-routes';
import { registerRoadRoutes } from './roads/routes';
import { registerTripRoutes } from './trips/routes';
import { registerTiles } from './tiles/tiles';
import { registerWorkshopRoutes } from './workshop/routes';
import { registerRideReportRoutes } from './drivers/ride-reports-routes';
import { registerExposureRoutes } from './drivers/exposure-routes';
import { registerSpeedAdviceRoutes } from './drivers/speed-advice-routes';
import type { Mailer } from './mail/mailer';
import { registerRideReportDigest } from './drivers/ride-mail';
import { registerMailRoutes } from './mail/routes';
import { registerJobRoutes } from './jobs/routes';
import type { StartNightly } from './jobs/service';
import { registerInspectionRoutes } from './inspections/routes';
import { registerWearRoutes } from './wear/routes';

export interface AppDeps {
  config: Config;
  db: Db;
  log: Logger;
  /** The app's clock; tests pass a fixed one. */
  now?: () => Date;
  auth?: Partial<AuthOptions>;
  /** Folder of the built web client; served with a fallback to index.html when present. */
  webDir?: string;
  /** Outgoing mail (server/mail/mailer.ts `createMailer`); without it, jobs cannot be run from the app. */
  mailer?: Mailer | null;
  /** Starts a nightly run for `POST /api/jobs/nightly/run` (jobs/nightly.ts); without it that answers 503. */
  startNightly?: StartNightly | null;
}

export interface BuiltApp {
  app: Express;
  /** The router holding every /api route, for the role-access test. */
  api: Router;
  /** Deletes expired session rows now (also done at start and every 15 minutes). */
  pruneSessions(): Promise<void>;
  close(): void;
}

/** `https://tiles.example.com` from a tile URL template, or null when it is not absolute. */
function originOf(template: string): string | null {
  try {
    // a {s} subdomain placeholder allows any subdomain of the host
    const origin = new URL(template.replace('{s}', 'subdomain').replace(/\{[a-z]\}/g, '0')).origin;
    return origin.replace('://subdomain.', '://*.');
  } catch {
    return null;
  }
}

/** Builds the Express app without listening, so tests and `main.ts` share it. */
export function createApp(deps: AppDeps): BuiltApp {
  const { config, db, log } = deps;
  // the manager digest's sections beyond the inspections (the digest is queued by the nightly job)
  registerRideReportDigest();
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);

  const SequelizeStore = connectSessionSequelize(session.Store);
  const store = new SequelizeStore({
    db: db.sequelize,
    tableName: 'sessions',
    checkExpirationInterval: 15 * 60 * 1000,
    expiration: 7 * 24 * 60 * 60 * 1000,
  });
  throttleTouch(store, TOUCH_EVERY_MS);
  // expired sessions go at start as well as every checkExpirationInterval
  const prune = () => (store as unknown as { clearExpiredSessions(): Promise<unknown> }).clearExpiredSessions().then(() => undefined);
  void prune();

  // Security headers through helmet: a Content-Security-Policy for the app's pages (scripts,
  // styles and data from this origin only; images also from the map tile host when one is set),
  // HSTS in production only (a development server over plain HTTP must stay reachable), and
  // nosniff, same-origin referrers and no framing.
  const tileOrigin = config.mapTileUrl ? originOf(config.mapTileUrl) : null;
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // leaflet and the charts position elements with inline style attributes
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:', ...(tileOrigin ? [tileOrigin] : [])],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          ...(config.production ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: config.production ? { maxAge: 180 * 24 * 60 * 60, includeSubDomains: true } : false,
      referrerPolicy: { policy: 'same-origin' },
      frameguard: { action: 'deny' },
      crossOriginEmbedderPolicy: false,
    }),
  );
  // Brotli or gzip for every compressible answer (the client's scripts, JSON, CSV) the browser accepts.
  app.use(compression());
  app.use(express.json({ limit: '2mb' }));
  app.use(cookieParser());
  app.use(
    session({
      name: config.production ? '__Host-rb.sid' : 'rb.sid',
      secret: config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: config.production,
        maxAge: 7 * 24 * 60 * 60 * 1000,
        path: '/',
      },
    }),
  );
  configurePassport();
  app.use(passport.session());

  // Signed-in requests bind the CSRF token to the session; anonymous ones (the sign-in form) to a
  // random cookie of their own, so an anonymous visitor stores no session row.
  const anonCookie = config.production ? '__Host-rb.anon' : 'rb.anon';
  const anonId = (req: express.Request, res: express.Response) => {
    const have = (req.cookies as Record<string, unknown> | undefined)?.[anonCookie];
    if (typeof have === 'string' && /^[A-Za-z0-9_-]{24}$/.test(have)) return have;
    const id = randomBytes(18).toString('base64url');
    res.cookie(anonCookie, id, { httpOnly: true, sameSite: 'strict', secure: config.production, path: '/' });
    (req.cookies as Record<string, unknown>)[anonCookie] = id;
    return id;
  };
  const { generateCsrfToken, doubleCsrfProtection } = doubleCsrf({
    getSecret: () => config.sessionSecret,
    getSessionIdentifier: (req) => (req.user ? `s:${req.session.id}` : `a:${String((req.cookies as Record<string, unknown>)[anonCookie] ?? '')}`),
    cookieName: config.production ? '__Host-rb.csrf' : 'rb.csrf',
    cookieOptions: { sameSite: 'strict', secure: config.production, httpOnly: true, path: '/' },
    getCsrfTokenFromRequest: (req) => req.headers['x-csrf-token'],
    errorConfig: { statusCode: 403, code: 'csrf_invalid', message: 'The form token is missing or stale. Reload the page and try again.' },
  });

  const api = Router();
  // API answers are per user and change often: never stored by a browser or proxy
  api.use(nocache());
  api.use(doubleCsrfProtection);
  // a temporary password set by a manager must be replaced before anything else
  api.use(passwordChangeGate);
  api.get('/health', open, (_req, res) => {
    res.json({ ok: true });
  });
  registerAuthRoutes(api, {
    csrfToken: (req, res) => {
      if (!req.user) anonId(req, res);
      return generateCsrfToken(req, res);
    },
    options: { ...defaultAuthOptions, ...deps.auth },
    sequelize: deps.db.sequelize,
  });
  registerUserRoutes(api, { now: deps.now ?? (() => new Date()), timeZone: config.timeZone });
  registerFleetRoutes(api, { inspectionThreshold: config.inspection.threshold, now: deps.now ?? (() => new Date()), timeZone: config.timeZone });
  registerFleetWriteRoutes(api, deps.now ?? (() => new Date()));
  registerRoadRoutes(api, { config, now: deps.now ?? (() => new Date()) });
  registerTripRoutes(api, { now: deps.now ?? (() => new Date()), timeZone: config.timeZone });
  // Drivers
  registerRideReportRoutes(api, { now: deps.now ?? (() => new Date()), dataDir: config.dataDir, publicUrl: config.publicUrl, log, mailer: deps.mailer ?? null });
  registerExposureRoutes(api, { now: deps.now ?? (() => new Date()), timeZone: config.timeZone });
  registerSpeedAdviceRoutes(api);
  registerJobRoutes(api, { config, db, log, mailer: deps.mailer ?? null, now: deps.now ?? (() => new Date()), startNightly: deps.startNightly ?? null });
  registerInspectionRoutes(api, { sequelize: db.sequelize, config, now: deps.now ?? (() => new Date()) });
  registerWearRoutes(api, { sequelize: db.sequelize, config });
  registerMailRoutes(api, { mailer: deps.mailer ?? null });
  // Workshop (after the inspections' /inspections/due so that literal path wins)
  registerWorkshopRoutes(api, { config, now: deps.now ?? (() => new Date()) });
  api.use((req, _res, next) => next(AppError.notFound(`The API address ${req.method} ${req.originalUrl}`)));

  app.use('/api', api);
  registerTiles(app);

  const webDir = deps.webDir;
  if (webDir && fs.existsSync(path.join(webDir, 'index.html'))) {
    // Built files under /assets carry a content hash in their name: a changed file gets a new
    // name, so browsers may keep these for a year without asking. A missing one is a 404 (an
    // old page asking for a chunk of a previous build), never the page itself.
    // The build writes each of them brotli- and gzip-compressed at the highest level beside the
    // file (vite.config.ts); those are sent as they are, the rest is compressed on the way out.
    app.use(
      '/assets',
      expressStaticGzip(path.join(webDir, 'assets'), {
        enableBrotli: true,
        orderPreference: ['br', 'gz'],
        index: false,
        serveStatic: { immutable: true, maxAge: '1y' },
      }),
    );
    app.use('/assets', (req, _res, next) => next(AppError.notFound(`The file ${req.originalUrl}`)));
    app.use(express.static(webDir, { index: false, maxAge: '1h' }));
    // The page itself names the current build's files, so the browser asks every time whether it changed.
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.sendFile(path.join(webDir, 'index.html'), { cacheControl: false, headers: { 'Cache-Control': 'no-cache' } });
    });
  }

  app.use((err: unknown, req: express.Request, res: express.Response, next: express.NextFunction) => {
    const e = err as { code?: string };
    if (e?.code === 'EBADCSRFTOKEN' || e?.code === 'csrf_invalid') {
      return next(new AppError(403, 'csrf_invalid', 'The form token is missing or stale. Reload the page and try again.'));
    }
    next(err);
  });
  app.use(errorHandler(log, config.production));

  return {
    app,
    api,
    close: () => store.stopExpiringSessions(),
    pruneSessions: prune,
  };
}
