// Runs bcrypt off the event loop (server/auth/passwords.ts starts it as a worker thread).
// Plain JavaScript so it loads whether or not the parent runs through tsx.
import { parentPort } from 'node:worker_threads';
import bcrypt from 'bcryptjs';

parentPort.on('message', ({ id, kind, password, cost, hash }) => {
  try {
    const result = kind === 'hash' ? bcrypt.hashSync(password, cost) : bcrypt.compareSync(password, hash);
    parentPort.postMessage({ id, result });
  } catch (err) {
    parentPort.postMessage({ id, error: err instanceof Error ? err.message : String(err) });
  }
});
