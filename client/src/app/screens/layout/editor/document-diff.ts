import type { NetworkDocument } from '../../../../../../engine/network-document';
import { diffVersions, type ElementRef, type VersionDiff } from '../../../../../../engine/review/version-diff';

/**
 * The save-conflict dialog's wording over the engine's comparison (engine/review/version-diff.ts,
 * the same diff the version history records): this file only says it in the farm's words, by name.
 */

/** "2 elements changed (Upper tee, P4), 1 added (East trough)"; names listed up to `maxNames` per group. */
export function describeChanges(d: VersionDiff, maxNames = 3): string {
  const names = (list: ElementRef[]) => {
    const shown = list.slice(0, maxNames).map((e) => e.name || e.id);
    return ` (${shown.join(', ')}${list.length > maxNames ? `, +${list.length - maxNames} more` : ''})`;
  };
  const parts: string[] = [];
  const groups: [ElementRef[], string][] = [
    [d.changed, 'changed'],
    [d.added, 'added'],
    [d.removed, 'removed'],
  ];
  for (const [list, verb] of groups) {
    if (!list.length) continue;
    const noun = parts.length ? '' : list.length === 1 ? ' element' : ' elements';
    parts.push(`${list.length}${noun} ${verb}${names(list)}`);
  }
  if (d.settings.length) parts.push(parts.length ? 'network settings changed' : 'network settings changed (title, backdrop, survey or patterns)');
  return parts.length ? parts.join(', ') : 'no changes';
}

/**
 * The conflict dialog's summary. With `base` (the version both sides started from) each side's
 * own changes are listed; without it, how their copy differs from yours.
 */
export function conflictSummary(base: NetworkDocument | null, mine: NetworkDocument, theirs: NetworkDocument): string {
  if (!base) return `Their copy compared with yours: ${describeChanges(diffVersions(mine, theirs))}.`;
  return `Theirs: ${describeChanges(diffVersions(base, theirs))}; yours: ${describeChanges(diffVersions(base, mine))}.`;
}
