/**
 * createApp(deps) -> the Express app. It never listens and never reads the environment:
 * server.ts does, and tests import this with an in-memory database.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import type { DataSource } from 'typeorm';
import type { RuleSet } from '#shared/engine/types';
import { bearerAuthentication } from './auth/bearer';
import { csrfProtection } from './auth/csrf';
import { configurePassport } from './auth/passport';
import { SignInThrottle } from './auth/sign-in-throttle';
import { SECURE_SESSION_COOKIE, SESSION_COOKIE } from './auth/session-cookie';
import { TypeormSessionStore } from './auth/session-store';
import { acquireEnginePool, type EnginePoolLease } from './engine/engine-pool';
import { ENGINE_VERSION } from '#shared/engine/index';
import { errorHandler } from './error-handler';
import { openApiDocument } from './openapi';
import { AppError } from './errors';
import { activityRoutes } from './routes/activity.routes';
import { apiTokensRoutes } from './routes/api-tokens.routes';
import { adminRoutes } from './routes/admin.routes';
import { authRoutes } from './routes/auth.routes';
import { batchRoutes } from './routes/batch.routes';
import { devicesRoutes } from './routes/devices.routes';
import { engineRoutes } from './routes/engine.routes';
import { measurementsRoutes } from './routes/measurements.routes';
import { projectsRoutes } from './routes/projects.routes';
import { proposalsRoutes } from './routes/proposals.routes';
import { VerificationQueue } from './verification/verification-queue';
import { SpiceEngine, type SpiceEngineOptions } from './verification/spice-engine';
import { specsRoutes } from './routes/specs.routes';
import { usersRoutes } from './routes/users.routes';
import { waitingRoutes } from './routes/waiting.routes';
import { searchRoutes } from './routes/search.routes';

/** Largest JSON body accepted (a spec or a design is a few kB). */
export const BODY_LIMIT = '256kb';
/** Idle sign-in lifetime, ms (a working day). */
const SESSION_MAX_AGE_MS = 12 * 60 * 60 * 1000;
export { SESSION_COOKIE, SECURE_SESSION_COOKIE } from './auth/session-cookie';

export interface AppDeps {
  dataSource: DataSource;
  sessionSecret: string;
  ruleSet: RuleSet;
  /** Trust X-Forwarded-* from a proxy (HTTPS terminated in front); cookies are then Secure on HTTPS. */
  trustProxy?: boolean;
  /** Where server errors are logged (default console.error). */
  log?: (message: string) => void;
  /** The built browser app (dist/web) to serve, with index.html for every non-API path. */
  staticDir?: string;
  /** The SPICE verification queue (default: one on this database, its engine started on the first job). */
  verification?: VerificationQueue;
  /** When to replace the default queue's simulator thread (runs, heap size); defaults in spice-engine.ts. */
  simulator?: SpiceEngineOptions;
  /**
   * Where uploaded files (bench measurements) are kept, named by their sha256. Default: `uploads`
   * beside a SQLite file; for an in-memory database a temporary folder removed by closeApp.
   */
  uploadsDir?: string;
  /** Proposals one person may ask for per minute (default PROPOSALS_PER_MINUTE; LONGTAIL_PROPOSALS_PER_MINUTE in server.ts). */
  proposalsPerMinute?: number;
  /** The clock of the sign-in delays, ms since the epoch (default Date.now; tests move it on). */
  clock?: () => number;
  /**
   * Worker threads for the engine (rankings, override evaluations): the process's pool is started
   * with this many, or joined when running (api/engine/engine-pool.ts). Default 0: the engine runs
   * on the request thread. server.ts passes LONGTAIL_ENGINE_WORKERS.
   */
  engineWorkers?: number;
}

export interface LongtailApp extends Express {
  /** Stops background timers (session pruning) and leaves the engine pool (its last user stops its threads). */
  closeApp(): void;
  /** This app's hold on the process's engine pool (closeApp releases it; awaiting `release()` waits for the threads to stop). */
  enginePool: EnginePoolLease;
  /** The verification queue the routes feed (tests wait on it and close it). */
  verification: VerificationQueue;
  /** Where uploaded files are kept (AppDeps.uploadsDir or its default). */
  uploadsDir: string;
}

/** The default uploads folder: beside a SQLite file, else a temporary one (removed by closeApp). */
function defaultUploadsDir(dataSource: DataSource): { dir: string; temporary: boolean } {
  const database = dataSource.options.type === 'better-sqlite3' ? String(dataSource.options.database) : '';
  if (database !== '' && database !== ':memory:') return { dir: join(dirname(resolve(database)), 'uploads'), temporary: false };
  return { dir: mkdtempSync(join(tmpdir(), 'longtail-uploads-')), temporary: true };
}

export function createApp(deps: AppDeps): LongtailApp {
  const app = express() as LongtailApp;
  app.enginePool = acquireEnginePool(deps.engineWorkers ?? 0);
  const store = new TypeormSessionStore(deps.dataSource);
  const passport = configurePassport(deps.dataSource);
  app.disable('x-powered-by');
  if (deps.trustProxy) app.set('trust proxy', 1);
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          imgSrc: ["'self'", 'data:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
        },
      },
    }),
  );
  // gzip for answers over 1 kB: the app's scripts and the stored rankings (tens of kB of JSON).
  app.use(compression());
  app.use(express.json({ limit: BODY_LIMIT, strict: true, type: ['application/json', 'application/*+json'] }));
  app.use(cookieParser());
  // One session middleware per scheme: `__Host-longtail.sid` (Secure) over HTTPS, `longtail.sid`
  // over plain HTTP (a local run), decided per request. Each needs a store object of its own
  // (express-session writes its cookie settings onto the store); both keep the one session table.
  const secureStore = new TypeormSessionStore(deps.dataSource, { prune: false });
  const sessionFor = (name: string, secure: boolean) =>
    session({
      name,
      secret: deps.sessionSecret,
      store: secure ? secureStore : store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure, path: '/', maxAge: SESSION_MAX_AGE_MS },
    });
  const plainSession = sessionFor(SESSION_COOKIE, false);
  const secureSession = sessionFor(SECURE_SESSION_COOKIE, true);
  app.use((req, res, next) => (req.secure ? secureSession : plainSession)(req, res, next));
  app.use(passport.initialize());
  app.use(passport.session());
  const csrf = csrfProtection(deps.sessionSecret);
  app.use('/api', bearerAuthentication(deps.dataSource));
  app.use('/api', csrf.require);
  app.use('/api/auth/tokens', apiTokensRoutes(deps.dataSource));
  app.use('/api/auth', authRoutes(passport, deps.dataSource, new SignInThrottle(deps.clock), csrf));
  app.use('/api/users', usersRoutes(deps.dataSource));
  app.use('/api/projects', projectsRoutes(deps.dataSource));
  app.use('/api/projects/:projectId/devices', devicesRoutes(deps.dataSource));
  app.use('/api/projects', batchRoutes(deps.dataSource));
  app.use('/api/projects', activityRoutes(deps.dataSource));
  app.use('/api/waiting', waitingRoutes(deps.dataSource));
  app.use('/api/search', searchRoutes(deps.dataSource));
  app.use('/api/specs', specsRoutes(deps.dataSource, deps.ruleSet, deps.proposalsPerMinute));
  const verification =
    deps.verification ??
    new VerificationQueue(deps.dataSource, { log: deps.log, singleInstance: deps.dataSource.options.type === 'better-sqlite3', engine: new SpiceEngine(undefined, deps.simulator) });
  app.verification = verification;
  const uploads = deps.uploadsDir ? { dir: resolve(deps.uploadsDir), temporary: false } : defaultUploadsDir(deps.dataSource);
  app.uploadsDir = uploads.dir;
  app.use('/api/proposals/:proposalId/measurements', measurementsRoutes(deps.dataSource, uploads.dir));
  app.use('/api/proposals', proposalsRoutes(deps.dataSource, deps.ruleSet, verification));
  app.use('/api/admin', adminRoutes(deps.dataSource));
  app.use('/api', engineRoutes(deps.ruleSet));
  // The API's own description, built from the routes above on the first request (api/openapi.ts).
  let description: object | undefined;
  app.get('/api/openapi.json', (_req, res) => {
    description ??= openApiDocument(app, ENGINE_VERSION);
    res.json(description);
  });
  app.use('/api', (_req, _res, next) => next(new AppError('route-not-found', 404, 'No such API route.')));
  if (deps.staticDir) {
    const indexHtml = join(deps.staticDir, 'index.html');
    app.use(express.static(deps.staticDir, { index: false, maxAge: '1h' }));
    app.get(/^\/(?!api\/).*/, (_req, res) => res.sendFile(indexHtml));
  }
  app.use(errorHandler(deps.log));
  app.closeApp = () => {
    store.close();
    void verification.close();
    void app.enginePool.release();
    if (uploads.temporary) rmSync(uploads.dir, { recursive: true, force: true });
  };
  return app;
}
