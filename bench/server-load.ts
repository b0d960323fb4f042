/**
 * The server under steady load on loopback (issue 13's goals): the real server as a child process
 * (fresh PGlite folder, demo seed, NODE_ENV=production), driven by autocannon.
 *
 *   1. signed-in GETs at 200/s: the project list and the demo's network, alternately;
 *   2. network saves of the demo at 100/s, each a valid optimistic save (a pool of projects holding
 *      the demo network; a request takes a project not in flight and sends its current version);
 *   3. a sign-in flood (random e-mails, 8 clients, as fast as the server answers) while the project
 *      list is read at 50/s, against the same list with no flood.
 *
 * "Server-side" times are the server's own per-request `responseTime` from its JSON log (from the
 * request reaching Express to the answer sent); "client" times are autocannon's, which add the
 * socket and this process. autocannon's rate limit releases each connection's quota at the start
 * of every second, so load arrives in bursts; the load is split over several autocannon instances
 * started at staggered phases to spread them. Goals: GET p99 ≤ 15 ms, save p99 ≤ 50 ms.
 * Run alone: `npx tsx bench/server-load.ts` (about 1.5 minutes; SECONDS=n per case).
 */
import { randomUUID } from 'node:crypto';
import { loadavg } from 'node:os';
import { startServerProcess } from '../spec/server-process';
import { percentile } from './harness';
import autocannon from 'autocannon';

const SECONDS = Number(process.env.SECONDS ?? 15);
const PASSWORD = 'runnel-demo-2026';

interface LogLine {
  req?: { method: string; path: string };
  res?: { statusCode: number };
  responseTime?: number;
}

const f = (x: number): string => `${x.toFixed(1)} ms`;

/** Cookie jar + CSRF token over fetch, for setting up (sign in, create projects). */
class Session {
  readonly cookies = new Map<string, string>();
  token = '';
  constructor(private readonly base: string) {}
  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }
  async request(method: string, path: string, body?: unknown): Promise<{ status: number; json: unknown }> {
    const res = await fetch(this.base + path, {
      method,
      headers: { cookie: this.cookieHeader(), 'content-type': 'application/json', ...(this.token ? { 'x-csrf-token': this.token } : {}) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
    const text = await res.text();
    return { status: res.status, json: text ? JSON.parse(text) : null };
  }
  async csrf(): Promise<void> {
    this.token = ((await this.request('GET', '/api/csrf')).json as { token: string }).token;
  }
  async signIn(email: string): Promise<void> {
    await this.csrf();
    const res = await this.request('POST', '/api/auth/signin', { email, password: PASSWORD });
    if (res.status !== 200) throw new Error(`sign-in ${email}: ${res.status}`);
    await this.csrf();
  }
}

type Request = autocannon.Request;

/**
 * Runs `rate` requests/s for `seconds`, split over `instances` autocannon instances started at
 * staggered phases (each with `connections` connections); resolves with every client-side latency and status.
 */
async function paced(
  base: string,
  opts: { rate: number; seconds: number; instances: number; connections: number; headers: Record<string, string>; requests: Request[] },
): Promise<{ ms: number[]; statuses: Map<number, number> }> {
  const ms: number[] = [];
  const statuses = new Map<number, number>();
  const runs: PromiseLike<unknown>[] = [];
  for (let i = 0; i < opts.instances; i++) {
    await new Promise((r) => setTimeout(r, 1000 / opts.instances));
    const instance = autocannon({
      url: base,
      connections: opts.connections,
      overallRate: opts.rate / opts.instances,
      duration: opts.seconds,
      headers: opts.headers,
      requests: opts.requests,
    });
    instance.on('response', (_client: unknown, status: number, _bytes: number, time: number) => {
      ms.push(time);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
    });
    runs.push(instance);
  }
  await Promise.all(runs);
  return { ms, statuses };
}

/** Server-side times of the log lines logged since `from`, for requests matching `match`. */
function serverTimes(lines: LogLine[], from: number, match: (l: LogLine) => boolean): number[] {
  return lines
    .slice(from)
    .filter((l) => l.responseTime !== undefined && match(l))
    .map((l) => l.responseTime!);
}

function report(label: string, server: number[], client: number[], statuses: Map<number, number>, goal?: number): string {
  const codes = [...statuses].map(([s, n]) => `${n}×${s}`).join(', ');
  const verdict = goal === undefined ? '' : percentile(server, 0.99) <= goal ? ` (goal p99 ≤ ${goal} ms: met)` : ` (goal p99 ≤ ${goal} ms: MISSED)`;
  return (
    `${label}: server median ${f(percentile(server, 0.5))}, p99 ${f(percentile(server, 0.99))}${verdict}; ` +
    `client median ${f(percentile(client, 0.5))}, p99 ${f(percentile(client, 0.99))}; ${server.length} requests (${codes})`
  );
}

async function main(): Promise<void> {
  const lines: LogLine[] = [];
  const server = await startServerProcess({
    env: {
      NODE_ENV: 'production',
      COOKIE_SECURE: 'false',
      LOG_LEVEL: 'info',
      // The flood comes from one address here; a budget this high stands for an attacker with many addresses.
      PASSWORD_CHECKS_PER_IP: '1000000',
    },
    onLine(line) {
      try {
        lines.push(JSON.parse(line) as LogLine);
      } catch {
        /* not a log line */
      }
    },
  });
  const base = server.baseUrl;
  try {
    console.log(
      `load average at start: ${loadavg()
        .map((x) => x.toFixed(2))
        .join(' ')} (${SECONDS} s per case)`,
    );
    const designer = new Session(base);
    await designer.signIn('designer@runnel.test');
    const projects = (await designer.request('GET', '/api/projects')).json as { id: string; name: string }[];
    const demo = projects.find((p) => p.name === 'Hillside smallholding')!;
    const demoNetwork = (await designer.request('GET', `/api/projects/${demo.id}/network`)).json as { version: number; document: unknown };
    const signedIn = { cookie: designer.cookieHeader() };

    // 1. Signed-in GETs at 200/s.
    const getPaths = ['/api/projects', `/api/projects/${demo.id}/network`];
    await paced(base, { rate: 50, seconds: 2, instances: 1, connections: 2, headers: signedIn, requests: getPaths.map((path) => ({ method: 'GET', path })) });
    let from = lines.length;
    const gets = await paced(base, {
      rate: 200,
      seconds: SECONDS,
      instances: 4,
      connections: 2,
      headers: signedIn,
      requests: getPaths.map((path) => ({ method: 'GET', path })),
    });
    const getLines = (l: LogLine) => l.req?.method === 'GET' && getPaths.includes(l.req.path);
    console.log(report('GET at 200/s (list + network)', serverTimes(lines, from, getLines), gets.ms, gets.statuses, 15));
    for (const path of getPaths) {
      const times = serverTimes(lines, from, (l) => l.req?.method === 'GET' && l.req.path === path);
      console.log(`  ${path.includes('network') ? 'network' : 'project list'}: server median ${f(percentile(times, 0.5))}, p99 ${f(percentile(times, 0.99))}`);
    }

    // 2. Saves of the demo network at 100/s, over a pool of projects (one save in flight per project).
    const pool: { id: string; version: number }[] = [];
    for (let i = 0; i < 12; i++) {
      const created = (await designer.request('POST', '/api/projects', { name: `Load ${i}` })).json as { id: string };
      const saved = await designer.request('PUT', `/api/projects/${created.id}/network`, { version: 0, document: demoNetwork.document });
      if (saved.status !== 200) throw new Error(`first save: ${saved.status} ${JSON.stringify(saved.json)}`);
      pool.push({ id: created.id, version: (saved.json as { version: number }).version });
    }
    const docText = JSON.stringify(demoNetwork.document);
    const saveRequest: Request = {
      method: 'PUT',
      setupRequest: (req, context) => {
        const project = pool.shift();
        if (!project) throw new Error('save pool empty: more connections than projects');
        context['project'] = project;
        return { ...req, path: `/api/projects/${project.id}/network`, body: `{"version":${project.version},"document":${docText}}` };
      },
      onResponse: (status, body, context) => {
        const project = context['project'] as { id: string; version: number };
        if (status === 200) project.version = (JSON.parse(body) as { version: number }).version;
        pool.push(project);
      },
    };
    const saveHeaders = { cookie: designer.cookieHeader(), 'x-csrf-token': designer.token, 'content-type': 'application/json' };
    from = lines.length;
    const everyProject = [...pool];
    const versionsBefore = everyProject.reduce((s, p) => s + p.version, 0);
    const saves = await paced(base, { rate: 100, seconds: SECONDS, instances: 4, connections: 2, headers: saveHeaders, requests: [saveRequest] });
    const savedCount = everyProject.reduce((s, p) => s + p.version, 0) - versionsBefore;
    const saveLines = (l: LogLine) => l.req?.method === 'PUT' && /\/network$/.test(l.req.path);
    console.log(report('network save at 100/s (demo)', serverTimes(lines, from, saveLines), saves.ms, saves.statuses, 50));
    console.log(
      `  versions moved by ${savedCount} over ${saves.statuses.get(200) ?? 0} saves answered 200 (each one new version; a 409 would be a stale version)`,
    );

    // 3. The project list at 50/s, alone and then during a sign-in flood of random e-mails from 8 clients.
    const listOnly = (l: LogLine) => l.req?.method === 'GET' && l.req.path === '/api/projects';
    const listRun = () =>
      paced(base, { rate: 50, seconds: SECONDS, instances: 2, connections: 1, headers: signedIn, requests: [{ method: 'GET', path: '/api/projects' }] });
    from = lines.length;
    const quiet = await listRun();
    console.log(report('project list at 50/s, no flood', serverTimes(lines, from, listOnly), quiet.ms, quiet.statuses));
    const flooder = new Session(base);
    await flooder.csrf();
    const floodHeaders = { cookie: flooder.cookieHeader(), 'x-csrf-token': flooder.token, 'content-type': 'application/json' };
    from = lines.length;
    const flood = autocannon({
      url: base,
      connections: 8,
      duration: SECONDS + 2,
      headers: floodHeaders,
      requests: [
        {
          method: 'POST',
          path: '/api/auth/signin',
          setupRequest: (req) => ({ ...req, body: JSON.stringify({ email: `${randomUUID()}@flood.test`, password: 'not-the-password' }) }),
        },
      ],
    });
    // Counted from the answers received (requests cut off when the run ends are logged by the server as 200s).
    const floodStatuses = new Map<number, number>();
    flood.on('response', (_client: unknown, status: number) => floodStatuses.set(status, (floodStatuses.get(status) ?? 0) + 1));
    await new Promise((r) => setTimeout(r, 1000));
    const during = await listRun();
    await flood;
    console.log(report('project list at 50/s during the flood', serverTimes(lines, from, listOnly), during.ms, during.statuses));
    const checked = floodStatuses.get(401) ?? 0;
    console.log(
      `  flood: ${[...floodStatuses.values()].reduce((a, b) => a + b, 0)} sign-ins answered in ${SECONDS + 2} s (${[...floodStatuses].map(([s, n]) => `${n}×${s}`).join(', ')}): ` +
        `${(checked / (SECONDS + 2)).toFixed(1)} bcrypt checks/s (401); a 429 is a check refused at once (per-IP budget or the password worker's full queue)`,
    );
    console.log(
      `load average at end: ${loadavg()
        .map((x) => x.toFixed(2))
        .join(' ')}`,
    );
  } finally {
    await server.stop();
  }
}

await main();
