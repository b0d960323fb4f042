/**
 * Starting Runnel: `tsx server/main.ts` from the repository root (npm start builds the client first).
 * Order matters: take the data folder's lock (a second process on the same PGlite folder is refused
 * before it reads anything), bind the port (a failed listen leaves the data untouched), and only then
 * open the store, migrate and seed. Until the app is ready, requests get 503.
 */
import { createServer, type RequestListener } from 'node:http';
import { createApp, type RunnelApp } from './app';
import { loadConfig } from './config';
import { acquireDataLock, DataLockError, type DataLock } from './data-lock';
import { openDatabase, pgliteDir, type Database } from './db';

const starting: RequestListener = (_req, res) => {
  res.writeHead(503, { 'Content-Type': 'application/json', 'Retry-After': '2' });
  res.end(JSON.stringify({ error: { code: 'starting', message: 'Runnel is starting; try again in a moment' } }));
};

async function main(): Promise<void> {
  const config = loadConfig();
  let lock: DataLock | null = null;
  if (!config.databaseUrl) {
    try {
      lock = acquireDataLock(pgliteDir(config.dataDir));
    } catch (err) {
      if (err instanceof DataLockError) {
        console.error(err.message);
        process.exit(1);
      }
      throw err;
    }
  }

  const server = createServer(starting);
  try {
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(config.port, config.host, () => {
        server.off('error', reject);
        resolve();
      });
    });
  } catch (err) {
    lock?.release();
    console.error(`Cannot listen on ${config.host}:${config.port}: ${err instanceof Error ? err.message : err}`);
    process.exit(1);
  }

  let database: Database;
  let runnel: RunnelApp;
  try {
    database = await openDatabase(
      config.databaseUrl ? { kind: 'postgres', url: config.databaseUrl } : { kind: 'pglite', dir: pgliteDir(config.dataDir), lock: lock! },
    );
    runnel = await createApp({ config, database });
  } catch (err) {
    server.close();
    lock?.release();
    throw err;
  }
  server.off('request', starting);
  server.on('request', runnel.app);

  const store = config.databaseUrl ? 'PostgreSQL (DATABASE_URL)' : `PGlite in ${config.dataDir}/pg, locked by pid ${process.pid}`;
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  runnel.logger.info(`Runnel listening on http://${config.host}:${port} (data: ${store})`);
  if (runnel.mailSinkPort) {
    const teamless = config.production ? 'sign-up is closed without SMTP_HOST' : 'mail for no team (sign-up links) is printed in this log, in development only';
    runnel.logger.info(`Mail is captured by the local SMTP sink on 127.0.0.1:${runnel.mailSinkPort}; admins see a team's mail under Outbox; ${teamless}`);
  }

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    runnel.logger.info(`${signal}: shutting down`);
    server.close(
      () =>
        void runnel
          .close()
          .then(() => database.close())
          .then(
            () => process.exit(0),
            () => process.exit(1),
          ),
    );
    server.closeAllConnections();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
