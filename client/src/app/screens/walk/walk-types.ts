/** What Walk mode records, as kept on the phone (IndexedDB) and sent to PUT /api/projects/:id/walks/:walkId. */

export const POINT_KINDS = [
  { value: 'spring-box', label: 'Spring box' },
  { value: 'tank-pad', label: 'Tank pad' },
  { value: 'tee', label: 'Tee' },
  { value: 'trough', label: 'Trough' },
  { value: 'bend', label: 'Bend' },
  { value: 'high-point', label: 'High point' },
  { value: 'low-point', label: 'Low point' },
  { value: 'crossing', label: 'Crossing' },
] as const;
export type PointKind = (typeof POINT_KINDS)[number]['value'];

export interface Walk {
  id: string;
  projectId: string;
  name: string;
  startedAt: string;
}

export interface WalkPoint {
  id: string;
  walkId: string;
  recordedAt: string;
  lat: number;
  lon: number;
  accuracy_m: number;
  label: string;
  kind: PointKind;
  elevation_m: number;
  elevation_source: 'fix' | 'typed';
  note: string;
  photo_id: string | null;
  poor_fix: boolean;
  /** 1 once the server has it (IndexedDB cannot index booleans). */
  synced: 0 | 1;
}

export interface TrackPoint {
  id: string;
  walkId: string;
  recordedAt: string;
  lat: number;
  lon: number;
  accuracy_m: number;
  elevation_m: number | null;
  synced: 0 | 1;
}

export interface WalkPhoto {
  id: string;
  walkId: string;
  blob: Blob;
  filename: string;
  synced: 0 | 1;
}

/** A position from the Geolocation API, reduced to what Walk mode uses. */
export interface Fix {
  lat: number;
  lon: number;
  accuracy_m: number;
  /** Metres above the WGS 84 ellipsoid as the phone reports it, or null. */
  altitude_m: number | null;
  timestamp: number;
}

/** The walk as the server returns it (GET …/walks/:walkId) and as the build step reads it. */
export interface WalkRecording {
  points: Omit<WalkPoint, 'walkId' | 'synced'>[];
  track: Omit<TrackPoint, 'walkId' | 'synced'>[];
}
