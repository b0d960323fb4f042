// Entry of an engine-pool worker thread: registers tsx in this thread, then loads the TypeScript
// worker (./worker.ts). Flags such as `--import tsx` do not reliably reach a worker's own imports,
// and spec/run-all.mjs registers tsx from code, which workers do not inherit at all.
import { register } from 'tsx/esm/api';

register();
const { default: run } = await import('./worker.ts');
export default run;
