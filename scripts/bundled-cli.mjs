// Runs an engine CLI (a TypeScript entry such as engine/cli.ts) from a JavaScript bundle instead of
// through tsx: tsx transpiles every module on each start and turns imports into getter calls,
// which made a cold `npm run -s solve` of a large network about 40 % slower. The bundle is kept in
// node_modules/.cache/runnel-cli/ and rebuilt with esbuild whenever it is missing or any file it
// was built from (engine sources, zod) is newer; the rebuild takes about 0.2 s and is written
// through a temporary file, so two runs at once never read half a bundle.
//
//   node scripts/bundled-cli.mjs engine/cli.ts network.json [options]
//
// Exit codes and messages are the entry's own (exit 2 naming element and field on bad input).
import { mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const entry = process.argv[2];
if (!entry || !entry.endsWith('.ts')) {
  process.stderr.write('usage: node scripts/bundled-cli.mjs <entry.ts> [arguments]\n');
  process.exit(2);
}
const entryPath = resolve(root, entry);
const name = relative(root, entryPath).replace(/[\\/]/g, '_').replace(/\.ts$/, '');
const cache = join(root, 'node_modules', '.cache', 'runnel-cli');
const bundle = join(cache, `${name}.mjs`);
const inputsFile = join(cache, `${name}.inputs.json`);

/** The bundle is fresh when it exists and none of the files it was built from changed since. */
function fresh() {
  let built;
  let inputs;
  try {
    built = statSync(bundle).mtimeMs;
    inputs = JSON.parse(readFileSync(inputsFile, 'utf8'));
  } catch {
    return false;
  }
  for (const file of inputs) {
    try {
      if (statSync(join(root, file)).mtimeMs > built) return false;
    } catch {
      return false; // an input was removed or renamed
    }
  }
  return true;
}

async function build() {
  const { build: esbuild } = await import('esbuild');
  mkdirSync(cache, { recursive: true });
  const temporary = `${bundle}.${process.pid}.tmp`;
  const result = await esbuild({
    entryPoints: [entryPath],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    outfile: temporary,
    metafile: true,
    logLevel: 'error',
    // a bundled CommonJS dependency may call require(): give the ES module one
    banner: { js: "import { createRequire as __runnelRequire } from 'node:module'; const require = __runnelRequire(import.meta.url);" },
  });
  const inputs = Object.keys(result.metafile.inputs).map((file) => relative(root, resolve(root, file)));
  writeFileSync(`${inputsFile}.${process.pid}.tmp`, JSON.stringify(inputs));
  renameSync(`${inputsFile}.${process.pid}.tmp`, inputsFile);
  renameSync(temporary, bundle);
}

if (!fresh()) await build();
// the entry reads its arguments from process.argv.slice(2), as when run directly
process.argv = [process.argv[0], join(cache, basename(bundle)), ...process.argv.slice(3)];
await import(pathToFileURL(bundle).href);
