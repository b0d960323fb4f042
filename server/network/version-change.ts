/**
 * The version history's one-line summary of a save (pure: the engine pool's worker runs it with the
 * save's solve, and the request thread only when the pool failed).
 */
import type { NetworkDocument } from '../../engine';
import { diffVersions, summariseDiff } from '../../engine/review/version-diff';

/** "1 point", "28 points": the summary speaks of the plan, not of graph terms. */
const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** What changed from `previous` (null: the first version) to `next`, in one line. */
export function versionChange(previous: NetworkDocument | null, next: NetworkDocument): string {
  return previous
    ? summariseDiff(diffVersions(previous, next))
    : `first version (${count(next.nodes.length, 'point', 'points')} joined by ${count(next.links.length, 'pipe, pump or valve', 'pipes, pumps and valves')})`;
}
