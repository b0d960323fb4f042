import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import type { LinkService, NodeService, PipeWork } from '../../../../../../engine/service-state';
import { PRESSURE_STATE_TEXT, pressureState } from '../../../../../../engine/profile/pressure-state';
import { formatQuantity, toDisplay, unitLabel, UnitSystem } from '../../../../../../engine/units';

/** How a badge looks: the state decides the ink, never a colour ramp. */
export type BadgeTone = 'ok' | 'close' | 'short' | 'near-rating' | 'over-rating' | 'tank' | 'quiet' | 'unset';

export interface PlanBadge {
  text: string;
  tone: BadgeTone;
}

const MINUS = '\u2212';

/** A pressure difference with its sign: "+12 psi", "−3 psi" (a true minus sign). */
export function signedPressure(m: number, units: UnitSystem): string {
  const shown = formatQuantity('pressure', Math.abs(m), units);
  const zero = Number(shown.split(' ')[0]) === 0;
  return `${zero ? '±' : m < 0 ? MINUS : '+'}${shown}`;
}

/** A volume with thousands grouped: "6,080 L", "1,606 gal". */
export function groupedVolume(m3: number, units: UnitSystem): string {
  const v = toDisplay('volume', m3, units);
  return `${Math.round(v).toLocaleString('en-US')} ${unitLabel('volume', units)}`;
}

/**
 * The badge an element wears on the plan, in the farm's words: an outlet's verdict with its margin
 * ("OK +12 psi", "close +1 psi", "short −3 psi"), a junction near or over the rating of its pipes
 * ("near rating 84 %", "over rating"), a junction below zero, a tank's water ("6,080 of 8,650 L").
 * Null when the element has nothing to say (a healthy tee, a source).
 */
export function nodeBadge(n: NetworkNode, s: NodeService | undefined, units: UnitSystem): PlanBadge | null {
  if (n.elevation_source === 'unset') return { text: 'elevation?', tone: 'unset' };
  if (!s) return null;
  if (n.kind === 'tank') {
    if (s.volume_m3 === undefined || s.capacity_m3 === undefined) return null;
    const cap = groupedVolume(s.capacity_m3, units);
    return { text: `${groupedVolume(s.volume_m3, units).split(' ')[0]} of ${cap}`, tone: 'tank' };
  }
  if (n.kind === 'source') return null;
  const rating = s.rating === 'over' ? 'over rating' : s.rating === 'near' ? `near rating ${Math.round((s.ratingShare ?? 0) * 100)} %` : '';
  const ratingTone: BadgeTone | null = s.rating === 'over' ? 'over-rating' : s.rating === 'near' ? 'near-rating' : null;
  if (n.kind === 'outlet') {
    if (s.state === 'no-supply') return { text: 'no supply', tone: 'short' };
    if (pressureState(s.pressure_m, true) === 'below-vacuum') return { text: PRESSURE_STATE_TEXT['below-vacuum'], tone: 'short' };
    const verdict =
      s.state === 'unknown' || s.margin_m === undefined
        ? formatQuantity('pressure', s.pressure_m, units)
        : `${s.state === 'ok' ? 'OK' : s.state} ${signedPressure(s.margin_m, units)}`;
    const tone: BadgeTone = s.state === 'short' ? 'short' : (ratingTone ?? (s.state === 'close' ? 'close' : s.state === 'ok' ? 'ok' : 'quiet'));
    return { text: rating ? `${verdict} · ${rating}` : verdict, tone };
  }
  if (s.state === 'no-supply') return { text: 'no supply', tone: 'short' };
  if (pressureState(s.pressure_m, true) === 'below-vacuum') return { text: PRESSURE_STATE_TEXT['below-vacuum'], tone: 'short' };
  if (s.pressure_m < 0) return { text: `below zero ${signedPressure(s.pressure_m, units)}`, tone: 'short' };
  return ratingTone ? { text: rating, tone: ratingTone } : null;
}

/** What a line's width says, for the results key and the pipe's own results. */
export const WORK_WORDS: Record<PipeWork, string> = {
  idle: 'no flow',
  light: 'light use',
  working: 'working',
  hard: 'near the speed limit',
  over: 'over the speed limit',
};

/** Line width (px) and dash for a pipe's work: wider is harder; over the limit adds a hatch. */
export function workStroke(work: PipeWork | undefined): { width: number; dash?: number[]; hatch: boolean } {
  switch (work) {
    case 'idle':
      return { width: 1.6, dash: [2, 4], hatch: false };
    case 'working':
      return { width: 3.5, hatch: false };
    case 'hard':
      return { width: 5, hatch: false };
    case 'over':
      return { width: 6, hatch: true };
    default:
      return { width: 2.2, hatch: false };
  }
}

/** The size written beside a pipe: its nominal size ('1-1/4"'), else its bore in the project's units. */
export function pipeSizeText(l: NetworkLink, units: UnitSystem): string {
  if (l.kind !== 'pipe') return '';
  return l.nominal ? l.nominal : formatQuantity('diameter', l.diameter_m, units);
}

/** A link's service for the results list: "light use", "held shut by check valve"… */
export function linkStateWords(l: NetworkLink, status: string, s: LinkService | undefined): string {
  if (status === 'check-closed') return 'held shut by check valve';
  if (status === 'closed') return l.kind === 'valve' ? 'shut' : 'closed';
  if (l.kind === 'pipe' && s) return WORK_WORDS[s.work];
  return status === 'active' ? 'reducing pressure' : 'open';
}
