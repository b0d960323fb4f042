/**
 * Shared helpers for the API tests: an app on a throw-away PGlite with the real migrations applied
 * and the demo data seeded, and agents that carry the session cookie and the CSRF token.
 */
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'chai';
import pg from 'pg';
import supertest, { type Response } from 'supertest';
import { createApp, type AppOptions, type RunnelApp } from '../../server/app';
import type { Config } from '../../server/config';
import { openDatabase, type Database } from '../../server/db';
import type { Role } from '../../server/permissions';
import { DEMO_PASSWORD, DEMO_USERS, OTHER_USER } from '../../server/seed';

/** bcrypt cost in tests: 4 is the minimum bcryptjs accepts, keeping sign-ins fast. */
export const TEST_BCRYPT_COST = 4;

export function testConfig(dataDir: string): Config {
  return {
    production: false,
    port: 0,
    host: '127.0.0.1',
    dataDir,
    sessionSecret: 'test-secret-0123456789abcdef',
    mailFrom: 'Runnel test <no-reply@runnel.test>',
    publicUrl: 'http://runnel.test',
    cookieSecure: false,
  };
}

export interface TestApp extends RunnelApp {
  /** A fresh agent with a CSRF token (not signed in). */
  anonymous(): Promise<ApiAgent>;
  /** An agent signed in as the demo user holding `role`, or as the second team's user ('other'). */
  signInAs(who: Role | 'other'): Promise<ApiAgent>;
  /** An agent signed in with any e-mail and password. */
  signIn(email: string, password: string): Promise<ApiAgent>;
}

/**
 * The store the API suite runs on: PGlite in memory by default; with RUNNEL_TEST_STORE=postgres, a
 * fresh database per app on the PostgreSQL server at RUNNEL_TEST_PG_URL (scripts/with-postgres.sh), so
 * the whole suite proves both stores. Returns the database and how to remove it.
 */
export async function testDatabase(): Promise<{ database: Database; drop(): Promise<void> }> {
  if (process.env['RUNNEL_TEST_STORE'] !== 'postgres') {
    const database = await openDatabase({ kind: 'pglite' });
    return { database, drop: async () => undefined };
  }
  const server = process.env['RUNNEL_TEST_PG_URL'];
  if (!server) throw new Error('RUNNEL_TEST_STORE=postgres needs RUNNEL_TEST_PG_URL (run through scripts/with-postgres.sh)');
  const fresh = await freshPostgresDatabase(server);
  const database = await openDatabase({ kind: 'postgres', url: fresh.url });
  return { database, drop: fresh.drop };
}

/** A new, empty database on the PostgreSQL server at `server`; drop() removes it. */
export async function freshPostgresDatabase(server: string): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `runnel_t_${randomBytes(6).toString('hex')}`;
  await adminQuery(server, `create database ${name}`);
  const url = new URL(server);
  url.pathname = `/${name}`;
  return { url: url.toString(), drop: () => adminQuery(server, `drop database if exists ${name} with (force)`) };
}

async function adminQuery(url: string, sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/**
 * Builds the app on the test store (testDatabase: in-memory PGlite, or a fresh PostgreSQL database)
 * or on a PGlite in `dataDir` (which survives close() so a test can reopen it), applies migrations
 * and seeds. Call close() in after().
 */
export async function startTestApp(options: Partial<AppOptions> & { dataDir?: string } = {}): Promise<TestApp> {
  const { dataDir, ...rest } = options;
  let drop = async () => undefined as void;
  let database = rest.database;
  if (!database && dataDir) database = await openDatabase({ kind: 'pglite', dir: join(dataDir, 'pg') });
  if (!database) ({ database, drop } = await testDatabase());
  const runnel = await createApp({
    config: testConfig(dataDir ?? '/nonexistent-test-data'),
    bcryptCost: TEST_BCRYPT_COST,
    log: false,
    // Every test signs in from 127.0.0.1, hundreds of times: the per-IP budget has its own spec.
    passwordBudget: { max: 1_000_000, windowMs: 60_000 },
    signupLimit: { perIp: 1_000_000, perEmail: 1_000_000, windowMs: 60_000 },
    ...rest,
    database,
  });
  const close = async () => {
    await runnel.close();
    if (!rest.database) {
      await database.close();
      await drop();
    }
  };
  const t: TestApp = {
    ...runnel,
    close,
    anonymous: () => ApiAgent.start(runnel),
    signIn: async (email, password) => {
      const agent = await ApiAgent.start(runnel);
      await agent.signIn(email, password);
      return agent;
    },
    signInAs: (who) => t.signIn(who === 'other' ? OTHER_USER.email : demoEmail(who), DEMO_PASSWORD),
  };
  return t;
}

/**
 * The set-up most project-scoped specs share: a fresh test app, its designer signed in, and the
 * demo project's API paths. Call `t.close()` in after().
 */
export async function startOnDemoProject(): Promise<{ t: TestApp; designer: ApiAgent; base: string; files: string }> {
  const t = await startTestApp();
  const designer = await t.signInAs('designer');
  const base = `/api/projects/${t.seeded!.demoProjectId}`;
  return { t, designer, base, files: `${base}/files` };
}

/** A supertest parser that keeps a response body as bytes: `agent.get(url).buffer(true).parse(binaryBody)`. */
export function binaryBody(res: Response, cb: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
}

export function demoEmail(role: Role): string {
  return DEMO_USERS.find((u) => u.role === role)!.email;
}

/** A temp directory under the OS temp dir; remove it with removeTempDir. */
export function makeTempDir(prefix = 'runnel-api-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

export function removeTempDir(dir: string): void {
  rmSync(dir, { recursive: true, force: true });
}

/** A supertest agent (cookie jar) that sends the CSRF token on every request. */
export class ApiAgent {
  token = '';
  /** `runnel.sid=…` as set at the last sign-in, to replay the session from another client. */
  sessionCookie = '';
  /** The session id inside the signed cookie (`s:<sid>.<signature>`), as stored in the sessions table. */
  get sid(): string {
    return decodeURIComponent(this.sessionCookie.split('=')[1] ?? '')
      .slice(2)
      .split('.')[0];
  }

  private constructor(readonly agent: ReturnType<typeof supertest.agent>) {}

  static async start(runnel: RunnelApp): Promise<ApiAgent> {
    const a = new ApiAgent(supertest.agent(runnel.app));
    await a.refreshCsrf();
    return a;
  }

  /** GET /api/csrf; needed again after sign-in or sign-out (the session is regenerated). */
  async refreshCsrf(): Promise<string> {
    const res = await this.agent.get('/api/csrf').expect(200);
    this.token = res.body.token;
    return this.token;
  }

  async signIn(email: string, password: string): Promise<void> {
    const res = await this.post('/api/auth/signin', { email, password });
    expect(res.status, `sign-in as ${email}: ${JSON.stringify(res.body)}`).to.equal(200);
    this.sessionCookie = /runnel\.sid=[^;]+/.exec(String(res.headers['set-cookie']))?.[0] ?? '';
    await this.refreshCsrf();
  }

  get(path: string) {
    return this.agent.get(path);
  }
  post(path: string, body?: object) {
    return this.agent
      .post(path)
      .set('x-csrf-token', this.token)
      .send(body ?? {});
  }
  put(path: string, body?: object) {
    return this.agent
      .put(path)
      .set('x-csrf-token', this.token)
      .send(body ?? {});
  }
  patch(path: string, body?: object) {
    return this.agent
      .patch(path)
      .set('x-csrf-token', this.token)
      .send(body ?? {});
  }
  delete(path: string) {
    return this.agent.delete(path).set('x-csrf-token', this.token);
  }
  /** A multipart POST with one file in field `file` and text fields. */
  upload(path: string, file: { bytes: Buffer; filename: string; contentType?: string }, fields: Record<string, string> = {}) {
    let req = this.agent.post(path).set('x-csrf-token', this.token);
    for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
    return req.attach('file', file.bytes, { filename: file.filename, contentType: file.contentType ?? 'application/octet-stream' });
  }
}
