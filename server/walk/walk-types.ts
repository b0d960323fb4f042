/** A walk recorded on a phone (Walk mode): the request body of PUT /api/projects/:id/walks/:walkId. */
import { z } from 'zod';

/** What a recorded point marks on the ground; the Walk screen offers these. */
export const POINT_KINDS = ['spring-box', 'tank-pad', 'tee', 'trough', 'bend', 'high-point', 'low-point', 'crossing'] as const;
export type PointKind = (typeof POINT_KINDS)[number];

const latitude = z.number().min(-90, 'must be within ±90°').max(90, 'must be within ±90°');
const longitude = z.number().min(-180, 'must be within ±180°').max(180, 'must be within ±180°');
/** Elevation in metres, within what any farm on Earth could have. */
const elevation = z.number().min(-500, 'must be at least −500 m').max(9000, 'must be at most 9000 m');

export const walkPointSchema = z.object({
  id: z.uuid('must be a UUID generated on the phone'),
  recordedAt: z.iso.datetime({ offset: true, error: 'must be an ISO date-time' }),
  lat: latitude,
  lon: longitude,
  accuracy_m: z.number().nonnegative().max(1e6),
  label: z.string().trim().min(1, 'is required').max(80),
  kind: z.enum(POINT_KINDS, { error: `must be one of ${POINT_KINDS.join(', ')}` }),
  elevation_m: elevation,
  elevation_source: z.enum(['fix', 'typed']),
  note: z.string().max(2000).default(''),
  photo_id: z.uuid().nullable().default(null),
  poor_fix: z.boolean().default(false),
});

export const trackPointSchema = z.object({
  id: z.uuid('must be a UUID generated on the phone'),
  recordedAt: z.iso.datetime({ offset: true, error: 'must be an ISO date-time' }),
  lat: latitude,
  lon: longitude,
  accuracy_m: z.number().nonnegative().max(1e6),
  /** From the fix's altitude; null when the phone gave none. */
  elevation_m: elevation.nullable(),
});

export const walkBodySchema = z.object({
  name: z.string().trim().min(1, 'is required').max(80),
  points: z.array(walkPointSchema).max(2000),
  track: z.array(trackPointSchema).max(20000),
});

export type WalkPoint = z.output<typeof walkPointSchema>;
export type TrackPoint = z.output<typeof trackPointSchema>;
export type WalkBody = z.output<typeof walkBodySchema>;
