/**
 * Command line for the review checklist (Node only; excluded from the browser build like ../cli.ts).
 *
 *   npm run -s review -- network.json            → Checklist JSON { rows, counts, solved } on stdout
 *   npm run -s review -- network.json --what-ifs → the single-failure what-if table as JSON
 *
 * Exit 0 on success (failing checks are part of the JSON), 2 on bad input with a message on stderr
 * naming the element and field.
 */
import { readFileSync } from 'node:fs';
import type { NetworkDocument } from '../network-document';
import { normaliseDocument } from '../steady';
import { validateDocument } from '../validate';
import { reviewChecklist } from './checklist';
import { whatIfs } from './what-ifs';

function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

function main(argv: string[]): void {
  const file = argv.find((a) => !a.startsWith('--'));
  if (!file) fail('usage: review <network.json> [--what-ifs]');
  let text = '';
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    fail(`${file}: cannot read (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (error) {
    fail(`${file}: not valid JSON (${(error as Error).message})`);
  }
  const invalid = validateDocument(doc);
  if (invalid.length > 0) fail(invalid.map((w) => w.message).join('\n'));
  const network = normaliseDocument(doc as NetworkDocument);
  const out = argv.includes('--what-ifs') ? whatIfs(network) : reviewChecklist(network);
  process.stdout.write(`${JSON.stringify(out)}\n`);
}

main(process.argv.slice(2));
