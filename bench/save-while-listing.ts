/**
 * A 10,000-node network saved again and again while another user lists projects: how long does
 * the list take? The real server runs as a child process (fresh PGlite data folder, demo seed);
 * this process is only the two clients. Run alone: `npm run bench:server` (about a minute).
 *
 * Prints the list's median and 95th percentile with no save running, then during saves (only
 * lists that overlapped a save count), and the saves' own median and answer size. Target: list
 * median < 50 ms during saves (the save-time check and solve run in the engine pool,
 * server/engine-pool, not on the request thread).
 */
import { startServerProcess } from '../spec/server-process';
import { percentile } from './harness';
import { loopedGrid } from './looped-grid';

const SAVES = Number(process.env.SAVES ?? 12);
const LIST_EVERY_MS = 25;

/** A signed-in client: cookie jar and CSRF token over fetch. */
class Client {
  private cookies = new Map<string, string>();
  private token = '';
  constructor(private readonly base: string) {}

  async request(method: string, path: string, body?: unknown): Promise<{ status: number; text: string; ms: number }> {
    const t0 = performance.now();
    const res = await fetch(this.base + path, {
      method,
      headers: {
        cookie: [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; '),
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        ...(this.token ? { 'x-csrf-token': this.token } : {}),
      },
      body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body),
    });
    const text = await res.text();
    const ms = performance.now() - t0;
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      this.cookies.set(pair.slice(0, i), pair.slice(i + 1));
    }
    return { status: res.status, text, ms };
  }

  async signIn(email: string): Promise<void> {
    this.token = JSON.parse((await this.request('GET', '/api/csrf')).text).token;
    const res = await this.request('POST', '/api/auth/signin', { email, password: 'runnel-demo-2026' });
    if (res.status !== 200) throw new Error(`sign-in ${email}: ${res.status} ${res.text}`);
    this.token = JSON.parse((await this.request('GET', '/api/csrf')).text).token;
  }
}

async function main(): Promise<void> {
  const server = await startServerProcess({ nodeArgs: (process.env.SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean) });
  const base = server.baseUrl;
  try {
    const designer = new Client(base);
    const reader = new Client(base);
    await designer.signIn('designer@runnel.test');
    await reader.signIn('reviewer@runnel.test');
    const created = await designer.request('POST', '/api/projects', { name: 'Bench grid' });
    const projectId = JSON.parse(created.text).id as string;
    const grid = loopedGrid(40, 250);
    const docText = (title: string): string => JSON.stringify({ ...grid, title });
    console.log(`network: ${grid.nodes.length} nodes, ${grid.links.length} links, ${(docText('x').length / 1e6).toFixed(1)} MB`);

    // Warm both paths (worker start-up, first solve of this layout) before measuring.
    let version = 0;
    const save = async (): Promise<{ ms: number; bytes: number }> => {
      const res = await designer.request('PUT', `/api/projects/${projectId}/network`, `{"version":${version},"document":${docText(`save ${version}`)}}`);
      if (res.status !== 200) throw new Error(`save: ${res.status} ${res.text.slice(0, 300)}`);
      version = JSON.parse(res.text).version;
      return { ms: res.ms, bytes: res.text.length };
    };
    await save();
    for (let i = 0; i < 5; i++) await reader.request('GET', '/api/projects');

    // Baseline: lists with no save running.
    const quiet: number[] = [];
    for (let i = 0; i < 60; i++) {
      quiet.push((await reader.request('GET', '/api/projects')).ms);
      await new Promise((r) => setTimeout(r, LIST_EVERY_MS));
    }

    // Saves back to back while the reader lists.
    let saving = true;
    const during: number[] = [];
    const lister = (async () => {
      while (saving) {
        const res = await reader.request('GET', '/api/projects');
        if (res.status !== 200) throw new Error(`list: ${res.status}`);
        if (saving) during.push(res.ms);
        await new Promise((r) => setTimeout(r, LIST_EVERY_MS));
      }
    })();
    const saves: { ms: number; bytes: number }[] = [];
    for (let i = 0; i < SAVES; i++) saves.push(await save());
    saving = false;
    await lister;

    const f = (x: number): string => `${x.toFixed(1)} ms`;
    console.log(`list projects, no save running: median ${f(percentile(quiet, 0.5))}, p95 ${f(percentile(quiet, 0.95))} (${quiet.length} lists)`);
    console.log(
      `list projects during saves:     median ${f(percentile(during, 0.5))}, p95 ${f(percentile(during, 0.95))}, max ${f(percentile(during, 1))} (${during.length} lists) — target median < 50 ms`,
    );
    console.log(
      `save (PUT network, 10,000 tees): median ${f(
        percentile(
          saves.map((s) => s.ms),
          0.5,
        ),
      )} over ${saves.length} saves; answer ${saves[0].bytes} bytes`,
    );
  } finally {
    await server.stop();
  }
}

await main();
