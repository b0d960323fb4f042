/**
 * A walk as a GPX 1.1 survey file (the format the survey parser already reads, server/survey):
 * recorded points as waypoints, the track as one track segment. Track fixes without an elevation
 * are left out of the file (the parser needs <ele> on every point) but stay in walk_points.
 *
 * @example
 * walkGpx('North line', [point], [fix]) // '<?xml …><gpx version="1.1" …><wpt lat="…" lon="…"><ele>312.4</ele>…'
 */
import type { TrackPoint, WalkPoint } from './walk-types';

const KIND_WORDS: Record<WalkPoint['kind'], string> = {
  'spring-box': 'spring box',
  'tank-pad': 'tank pad',
  tee: 'tee',
  trough: 'trough',
  bend: 'bend',
  'high-point': 'high point',
  'low-point': 'low point',
  crossing: 'crossing',
};

export function kindWords(kind: WalkPoint['kind']): string {
  return KIND_WORDS[kind];
}

function esc(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** Metres to a GPX number: millimetres are more than a phone knows. */
const num = (v: number, digits: number) => String(Number(v.toFixed(digits)));

export function walkGpx(name: string, points: readonly WalkPoint[], track: readonly TrackPoint[], photoHref?: (id: string) => string): string {
  const lines = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<gpx version="1.1" creator="Runnel Walk" xmlns="http://www.topografix.com/GPX/1/1" xmlns:rn="urn:runnel:walk:1">',
    `  <metadata><name>${esc(name)}</name></metadata>`,
  ];
  for (const p of points) {
    const desc = `${kindWords(p.kind)}; fix ±${num(p.accuracy_m, 1)} m${p.poor_fix ? ' (poor)' : ''}; elevation ${p.elevation_source === 'typed' ? 'typed' : 'from the fix'}`;
    lines.push(
      `  <wpt lat="${num(p.lat, 7)}" lon="${num(p.lon, 7)}">`,
      `    <ele>${num(p.elevation_m, 2)}</ele>`,
      `    <time>${esc(p.recordedAt)}</time>`,
      `    <name>${esc(p.label)}</name>`,
      ...(p.note ? [`    <cmt>${esc(p.note)}</cmt>`] : []),
      `    <desc>${esc(desc)}</desc>`,
      ...(p.photo_id && photoHref ? [`    <link href="${esc(photoHref(p.photo_id))}"><text>photo</text></link>`] : []),
      `    <type>${esc(kindWords(p.kind))}</type>`,
      `    <extensions><rn:uid>${p.id}</rn:uid></extensions>`,
      '  </wpt>',
    );
  }
  const withElevation = track.filter((t) => t.elevation_m !== null);
  if (withElevation.length > 0) {
    lines.push(`  <trk><name>${esc(name)} track</name><trkseg>`);
    for (const t of withElevation) {
      lines.push(`    <trkpt lat="${num(t.lat, 7)}" lon="${num(t.lon, 7)}"><ele>${num(t.elevation_m!, 2)}</ele><time>${esc(t.recordedAt)}</time></trkpt>`);
    }
    lines.push('  </trkseg></trk>');
  }
  lines.push('</gpx>', '');
  return lines.join('\n');
}
