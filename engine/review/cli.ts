/**
 * Command line for the review checklist (Node only; excluded from the browser build like ../cli.ts).
 *
 *   npm run -s review -- network.json            → Checklist JSON { rows, counts, solved } on stdout
 *   npm run -s review -- network.json --what-ifs → the single-failure what-if table as JSON
 *
 * Exit 0 on success (failing checks are part of the JSON), 2 on bad input with a message on stderr
 * naming the element and field.
 */
import { CliArgs, checkedDocument, fail, printJson, readJson } from '../cli-io';
import { normaliseDocument } from '../steady';
import { reviewChecklist } from './checklist';
import { whatIfs } from './what-ifs';

function main(argv: string[]): void {
  const args = new CliArgs(argv, []);
  const file = args.file;
  if (!file) fail('usage: review <network.json> [--what-ifs]');
  const network = normaliseDocument(checkedDocument(readJson(file)));
  printJson(args.has('--what-ifs') ? whatIfs(network) : reviewChecklist(network));
}

main(process.argv.slice(2));
