/**
 * Building the Express app (without listening): database, mail, sessions, CSRF, the /api routes,
 * the built client and the central error handler. server/main.ts listens; tests call createApp.
 */
import { existsSync } from 'node:fs';
import { extname, join, resolve } from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { ApiRoutes, type RouteSpec } from './api-routes';
import { createCsrf } from './auth/csrf';
import { createPassport, currentMember } from './auth/passport';
import { DEFAULT_PASSWORD_BUDGET, passwordBudget, type PasswordBudget } from './auth/password-budget';
import { DEFAULT_BCRYPT_COST, sharedPasswordPool, type PasswordPool } from './auth/passwords';
import { DrizzleSessionStore } from './auth/session-store';
import type { Config } from './config';
import type { AppContext } from './context';
import { openDatabase, pgliteDir, type Database, type Db } from './db';
import { apiNotFound, errorHandler, notFoundHandler } from './errors';
import { createLogger, requestLogger, type LogLevel, type Logger } from './logging';
import { loadProject } from './project-scope';
import { checkJsonText, requireJsonOrMultipart } from './request-guards';
import { createMailer } from './mail/mailer';
import { startMailSink, type MailSink } from './mail/sink';
import { logTeamlessMail } from './mail/dev-mail-log';
import { rollingSessionCookie } from './auth/rolling-cookie';
import { budgetRoutes } from './routes/budget';
import { profileRoutes } from './routes/profile';
import { authRoutes, SESSION_COOKIE, type SigninLimit } from './routes/auth';
import { optionRoutes } from './routes/options';
import { DEFAULT_SIGNUP_LIMIT, signupRoutes, type SignupLimit } from './routes/signup';
import { priceRoutes } from './routes/prices';
import { takeoffRoutes } from './routes/takeoff';
import { fileRoutes } from './routes/files';
import { walkRoutes } from './routes/walks';
import { networkRoutes } from './routes/network';
import { projectRoutes } from './routes/projects';
import { teamRoutes } from './routes/team';
import { versionRoutes } from './routes/versions';
import { reviewRoutes } from './routes/review';
import { warmEnginePool } from './engine-pool/pool';
import { seed as seedDemo, type SeedResult } from './seed';
import './types';

export interface AppOptions {
  config: Config;
  /** An open database (the caller closes it); default: opened from config (DATABASE_URL or PGlite in dataDir/pg). */
  database?: Database;
  /** bcrypt cost for new hashes; default 10. Tests use 4. */
  bcryptCost?: number;
  /** Failed sign-ins allowed per IP and e-mail per window; default 10 per 15 minutes. */
  signinLimit?: SigninLimit;
  /** Sign-up requests allowed per IP and per e-mail per window; default 10 and 3 per hour. */
  signupLimit?: SignupLimit;
  /** Password checks (sign-in, sign-up, invitation accept) allowed per IP per window; default 50 per 15 minutes. */
  passwordBudget?: PasswordBudget;
  /** Worker threads for bcrypt; default the process-wide pool (1 worker, 16 waiting). */
  passwordPool?: PasswordPool;
  /** Insert the demo data when missing (server/seed.ts); default true. */
  seed?: boolean;
  /** Where the JSON log lines (server/logging.ts) go: a function per line, false for silence. Default stdout. */
  log?: ((line: string) => void) | false;
  /** Lowest level logged; default config.logLevel, else 'info'. */
  logLevel?: LogLevel;
  /** The built Angular app; default dist/client/browser. Its index.html answers client routes when it exists. */
  clientDir?: string;
}

export interface RunnelApp {
  app: Express;
  db: Db;
  /** Every /api route with its access (method, path relative to /api). */
  routes: RouteSpec[];
  /** Port of the local SMTP sink when no SMTP server is configured. */
  mailSinkPort: number | null;
  seeded: SeedResult | null;
  /** The app's pino logger (main.ts logs its start-up lines through it). */
  logger: Logger;
  close(): Promise<void>;
}

export const JSON_BODY_LIMIT = '5mb';
/** A session lasts this long after its last use (the cookie's expiry rolls: server/auth/rolling-cookie.ts). */
export const SESSION_MAX_AGE_MS = 14 * 24 * 60 * 60 * 1000;
/** Angular's build loads its stylesheet with onload="this.media='all'"; this allows exactly that handler. */
const ANGULAR_STYLESHEET_ONLOAD = "'sha256-MhtPZXr7+LpJUY5qtMutB+qWfQtMaPccfe7QXtCcEYc='";

export async function createApp(options: AppOptions): Promise<RunnelApp> {
  const { config } = options;
  const logger = createLogger(options.log, options.logLevel ?? config.logLevel ?? 'info');
  // Route modules report what they survived (a failed save-time solve, a mail that bounced) as warnings.
  const log = (line: string) => logger.warn(line);
  const bcryptCost = options.bcryptCost ?? DEFAULT_BCRYPT_COST;
  warmEnginePool();

  const database =
    options.database ??
    (await openDatabase(config.databaseUrl ? { kind: 'postgres', url: config.databaseUrl } : { kind: 'pglite', dir: pgliteDir(config.dataDir) }));
  const db = database.db;

  let sink: MailSink | null = null;
  if (!config.smtp) sink = await startMailSink(db);
  const sent = createMailer(config.smtp ?? { host: '127.0.0.1', port: sink!.port }, config.mailFrom);
  // Development without SMTP: mail no team's Outbox shows (sign-up links) goes to the log too. Never in production.
  const mailer = sink && !config.production ? logTeamlessMail(sent, logger) : sent;
  if (sink && config.production)
    logger.warn("No SMTP_HOST in production: mail is kept in the teams' Outbox only, and sign-up is closed (503) until SMTP_HOST is set");

  const seeded = options.seed === false ? null : await database.exclusive(() => seedDemo(db, { bcryptCost }));
  const passwords = options.passwordPool ?? sharedPasswordPool();
  const ctx: AppContext = {
    db,
    config,
    mailer,
    bcryptCost,
    log,
    passwords,
    passwordBudget: passwordBudget(
      db,
      options.passwordBudget ?? { ...DEFAULT_PASSWORD_BUDGET, max: config.passwordChecksPerIp ?? DEFAULT_PASSWORD_BUDGET.max },
    ),
  };

  const store = new DrizzleSessionStore(db);
  const passport = createPassport(db, bcryptCost, passwords);
  const csrf = createCsrf(config.sessionSecret, config.cookieSecure);

  const app = express();
  app.disable('x-powered-by');
  if (config.trustProxy !== undefined) app.set('trust proxy', config.trustProxy);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          // wasm-unsafe-eval lets the engine compile its own WebAssembly kernel (no eval of text)
          scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
          scriptSrcAttr: ["'unsafe-hashes'", ANGULAR_STYLESHEET_ONLOAD],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          workerSrc: ["'self'", 'blob:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          upgradeInsecureRequests: config.cookieSecure ? [] : null,
        },
      },
      // HSTS only where the site is served over HTTPS (the same switch as Secure cookies).
      strictTransportSecurity: config.cookieSecure,
    }),
  );
  app.use(requestLogger(logger));

  const api = new ApiRoutes(loadProject(db));
  api.get('/csrf', 'public', csrf.issue);
  authRoutes(api, ctx, passport, options.signinLimit ?? { max: 10, windowMs: 15 * 60 * 1000 });
  signupRoutes(api, ctx, options.signupLimit ?? DEFAULT_SIGNUP_LIMIT);
  teamRoutes(api, ctx);
  projectRoutes(api, ctx);
  networkRoutes(api, ctx);
  budgetRoutes(api, ctx);
  profileRoutes(api, ctx);
  versionRoutes(api, ctx);
  reviewRoutes(api, ctx);
  fileRoutes(api, ctx);
  priceRoutes(api, ctx);
  optionRoutes(api, ctx);
  takeoffRoutes(api, ctx);
  walkRoutes(api, ctx);

  app.use(
    '/api',
    requireJsonOrMultipart,
    express.json({ limit: JSON_BODY_LIMIT }),
    checkJsonText,
    cookieParser(),
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store,
      resave: false,
      saveUninitialized: false,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.cookieSecure, maxAge: SESSION_MAX_AGE_MS },
    }),
    passport.initialize(),
    passport.session(),
    rollingSessionCookie(SESSION_MAX_AGE_MS),
    currentMember(db),
    csrf.protect,
    api.router,
    apiNotFound,
  );

  const clientDir = options.clientDir ?? resolve(import.meta.dirname, '../dist/client/browser');
  const indexHtml = join(clientDir, 'index.html');
  // Checked per request: the client may be (re)built while the server runs.
  app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
  app.use((req, res, next) => {
    // Client routes (/projects/…, /join/…) get the app; a missing asset (has an extension) stays 404.
    if ((req.method !== 'GET' && req.method !== 'HEAD') || extname(req.path) || !existsSync(indexHtml)) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
  app.use(notFoundHandler);
  app.use(errorHandler(logger));

  return {
    app,
    db,
    routes: api.table.map((r) => ({ ...r })),
    mailSinkPort: sink?.port ?? null,
    seeded,
    logger,
    async close() {
      store.stop();
      mailer.close();
      await sink?.close();
      if (!options.database) await database.close();
    },
  };
}
