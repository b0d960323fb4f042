/**
 * What every engine command line shares (Node only; excluded from the browser build and from
 * tsconfig.engine.json like the CLIs): reading the input file, options, the document check, and
 * exit 2 with a message on stderr naming the file, row and field.
 */
import { readFileSync } from 'node:fs';
import type { NetworkDocument } from './network-document';
import { validateDocument } from './validate';

/** Bad input: the message on stderr, exit code 2. */
export function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

/** The file's JSON, or exit 2 naming the file (unreadable, or not JSON). */
export function readJson(file: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    fail(`${file}: cannot read (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  try {
    return JSON.parse(text);
  } catch (error) {
    fail(`${file}: not valid JSON (${(error as Error).message})`);
  }
}

/** The document if it passes the engine's schema and bounds, or exit 2 with one line per problem (each after `prefix`). */
export function checkedDocument(doc: unknown, prefix = ''): NetworkDocument {
  const invalid = validateDocument(doc);
  if (invalid.length > 0) fail(invalid.map((w) => `${prefix}${w.message}`).join('\n'));
  return doc as NetworkDocument;
}

/** Command-line words: the input file and `--name value` options (`valued` lists the options that take a value). */
export class CliArgs {
  constructor(
    readonly args: string[],
    private readonly valued: readonly string[],
  ) {}

  /** The first word that is neither an option nor an option's value. */
  get file(): string | undefined {
    return this.args.find((a, i) => !a.startsWith('--') && !this.valued.includes(this.args[i - 1]));
  }

  has(name: string): boolean {
    return this.args.includes(name);
  }

  /** The option's value; undefined when the option is absent, '' when it has no value. */
  text(name: string): string | undefined {
    const i = this.args.indexOf(name);
    return i < 0 ? undefined : (this.args[i + 1] ?? '');
  }

  /** A number option (undefined when absent), or exit 2: `positive` refuses 0, `non-negative` allows it. */
  number(name: string, sign: 'positive' | 'non-negative'): number | undefined {
    const v = this.text(name);
    if (v === undefined) return undefined;
    const n = Number(v);
    if (v === '' || !Number.isFinite(n) || n < 0 || (sign === 'positive' && n === 0)) fail(`${name}: must be a ${sign} number (got ${v || 'nothing'})`);
    return n;
  }
}

/** One line of JSON on stdout (JSON writes a non-finite number, such as an open-ended time, as null). */
export function printJson(value: unknown): void {
  process.stdout.write(`${JSON.stringify(value)}\n`);
}
