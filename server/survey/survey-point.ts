/** A surveyed ground point, in metres (x/y on the site plan) or degrees (lat/lon). */
export interface SurveyPoint {
  label?: string;
  x_m?: number;
  y_m?: number;
  lat?: number;
  lon?: number;
  elevation_m: number;
}

export type SurveyFormat = 'csv' | 'gpx';

export interface SurveyParse { format: SurveyFormat; points: SurveyPoint[] }

/** A parse failure naming where: `line` (CSV, 1-based, header is line 1) or `point` (GPX, 1-based). */
export class SurveyError extends Error {
  constructor(message: string, readonly where: { line: number } | { point: number }) {
    super(message);
  }
}

/** International foot (exact, NIST SP 811). */
export const METRES_PER_FOOT = 0.3048;
