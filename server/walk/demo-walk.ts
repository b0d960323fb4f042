/**
 * The demo's walk (invented): the designer walked from the east trough down to a site for a new
 * trough, marking a knoll and a gate crossing, with a track fix every few metres. Placed through the
 * demo network's geographic reference so it lies on the plan; stored through the same path as a sync.
 */
import { randomUUID } from 'node:crypto';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { geoReferenceOf, toLonLat } from '../../engine/geo-reference';
import type { DbOrTx } from '../db';
import { syncWalk } from './walk-store';
import type { WalkBody } from './walk-types';

export const DEMO_WALK_NAME = 'East paddock recce';

export async function seedDemoWalk(tx: DbOrTx, project: { id: string; teamId: string; name: string }, user: { id: string; email: string }): Promise<void> {
  const ref = geoReferenceOf(hillSmallholding.layout);
  if (!ref) throw new Error('demo: the network has no geographic reference');
  const at = (x: number, y: number) => {
    const [lon, lat] = toLonLat(ref, x, y);
    return { lat, lon };
  };
  const time = (minute: number) => new Date(Date.UTC(2026, 9, 14, 9, minute)).toISOString();
  const point = (minute: number, label: string, kind: WalkBody['points'][number]['kind'], x: number, y: number, z: number, note = '') => ({
    id: randomUUID(),
    recordedAt: time(minute),
    ...at(x, y),
    accuracy_m: 4,
    label,
    kind,
    elevation_m: z,
    elevation_source: 'typed' as const,
    note,
    photo_id: null,
    poor_fix: false,
  });
  // Ground along the walk (x, y, elevation m): from the east trough (560, 372, 146 m) south to the new site.
  const ground: [number, number, number][] = [
    [560, 370, 146],
    [566, 345, 148],
    [574, 320, 149.5],
    [570, 300, 145],
    [565, 280, 141],
    [562, 262, 139],
    [560, 250, 138],
  ];
  const body: WalkBody = {
    name: DEMO_WALK_NAME,
    points: [
      point(4, 'Knoll', 'high-point', 574, 320, 149.5, 'Air valve here: the line rises 3.5 m above the trough.'),
      point(7, 'Gate crossing', 'crossing', 565, 280, 141, 'Sleeve under the gateway.'),
      point(9, 'New trough site', 'trough', 560, 250, 138, 'Level pad by the fence corner.'),
    ],
    track: ground.map(([x, y, z], i) => ({ id: randomUUID(), recordedAt: time(i * 1.5), ...at(x, y), accuracy_m: 5, elevation_m: z })),
  };
  await syncWalk(tx, { project, walkId: randomUUID(), body, user });
}
