/** Starting Runnel: `tsx server/main.ts` from the repository root (npm start builds the client first). */
import { createApp } from './app';
import { loadConfig } from './config';

async function main(): Promise<void> {
  const config = loadConfig();
  const runnel = await createApp({ config });
  const server = runnel.app.listen(config.port, config.host, (error?: Error) => {
    if (error) {
      console.error(`Cannot listen on ${config.host}:${config.port}: ${error.message}`);
      void runnel.close().finally(() => process.exit(1));
      return;
    }
    const store = config.databaseUrl ? 'PostgreSQL (DATABASE_URL)' : `PGlite in ${config.dataDir}/pg`;
    console.log(`Runnel listening on http://${config.host}:${config.port} (data: ${store})`);
    if (runnel.mailSinkPort) console.log(`Mail is captured by the local SMTP sink on 127.0.0.1:${runnel.mailSinkPort}; admins see it under Outbox`);
  });
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: shutting down`);
    server.close(() => void runnel.close().then(() => process.exit(0), () => process.exit(1)));
    server.closeAllConnections();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
