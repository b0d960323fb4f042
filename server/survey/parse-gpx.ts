/**
 * Survey points from GPX 1.1: waypoints, route points and track points in document order, each
 * needing lat, lon and an <ele> elevation (metres, as GPX defines). Errors name the 1-based point.
 *
 * @example
 * parseSurveyGpx('<gpx><wpt lat="45" lon="-120"><ele>310</ele><name>Spring</name></wpt></gpx>')
 * // → { format: 'gpx', points: [{ label: 'Spring', lat: 45, lon: -120, elevation_m: 310 }] }
 */
import { DOMParser, type Element, type Node } from '@xmldom/xmldom';
import { SurveyError, type SurveyParse, type SurveyPoint } from './survey-point';

const POINT_TAGS = new Set(['wpt', 'rtept', 'trkpt']);
const ELEMENT_NODE = 1;

function childText(el: Element, tag: string): string | undefined {
  for (let c = el.firstChild; c; c = c.nextSibling) {
    if (c.nodeType === ELEMENT_NODE && localName(c) === tag) return (c.textContent ?? '').trim();
  }
  return undefined;
}

function localName(node: Node): string {
  return (node as Element).localName ?? node.nodeName;
}

/** Deeper nesting than any GPX needs (gpx › trk › trkseg › trkpt › extensions…): refused, not recursed into. */
export const GPX_MAX_DEPTH = 64;

/** Point elements in document order; iterative, so a 20,000-deep file cannot overflow the stack. */
function collectPoints(root: Node): Element[] {
  const out: Element[] = [];
  const stack: { node: Node | null; depth: number }[] = [{ node: root.firstChild, depth: 1 }];
  while (stack.length) {
    const top = stack[stack.length - 1];
    const c = top.node;
    if (!c) {
      stack.pop();
      continue;
    }
    top.node = c.nextSibling;
    if (c.nodeType !== ELEMENT_NODE) continue;
    if (POINT_TAGS.has(localName(c))) {
      out.push(c as Element);
      continue;
    }
    if (top.depth >= GPX_MAX_DEPTH) {
      throw new SurveyError(`point 0: the GPX file nests elements more than ${GPX_MAX_DEPTH} levels deep`, { point: 0 });
    }
    stack.push({ node: c.firstChild, depth: top.depth + 1 });
  }
  return out;
}

export function parseSurveyGpx(text: string): SurveyParse {
  let failure: string | undefined;
  let root: Element | null = null;
  try {
    root = new DOMParser({
      onError: (level, message) => {
        if (level !== 'warning' && !failure) failure = message;
      },
    }).parseFromString(text.replace(/^\uFEFF/, ''), 'text/xml').documentElement;
  } catch (err) {
    // xmldom throws on fatal errors (unclosed tags) after reporting them.
    failure ??= err instanceof Error ? err.message : String(err);
  }
  if (failure || !root || localName(root) !== 'gpx') {
    throw new SurveyError(`point 0: not a GPX file${failure ? ` (${failure.split('\n')[0]})` : ''}`, { point: 0 });
  }
  const elements = collectPoints(root);
  if (elements.length === 0) throw new SurveyError('point 1: the GPX file has no wpt, rtept or trkpt points', { point: 1 });
  const points = elements.map((el, i): SurveyPoint => {
    const n = i + 1;
    const number = (raw: string | null | undefined, what: string, limit?: number): number => {
      if (raw === null || raw === undefined || raw.trim() === '') throw new SurveyError(`point ${n}: ${what} is missing`, { point: n });
      const value = Number(raw);
      if (!Number.isFinite(value)) throw new SurveyError(`point ${n}: ${what} "${raw}" is not a number`, { point: n });
      if (limit !== undefined && Math.abs(value) > limit) throw new SurveyError(`point ${n}: ${what} ${value} is outside ±${limit}°`, { point: n });
      return value;
    };
    const lat = number(el.getAttribute('lat'), 'lat', 90);
    const lon = number(el.getAttribute('lon'), 'lon', 180);
    const elevation = number(childText(el, 'ele'), 'elevation (<ele>)');
    const label = childText(el, 'name');
    return { ...(label ? { label } : {}), lat, lon, elevation_m: elevation };
  });
  return { format: 'gpx', points };
}
