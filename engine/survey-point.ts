/**
 * A surveyed ground point as read from a survey file (server/survey, answered by
 * POST /api/projects/:id/survey/parse): site-plan metres (x_m/y_m) or degrees (lat/lon), with an
 * elevation in metres. The Layout projects them to site metres and stores them in the document
 * (SurveyPoint in ./network-document). Types only: shared by server and client.
 */
import type { SURVEY_FORMATS } from './document-schema';

export interface ParsedSurveyPoint {
  label?: string;
  x_m?: number;
  y_m?: number;
  lat?: number;
  lon?: number;
  elevation_m: number;
}

export type SurveyFormat = (typeof SURVEY_FORMATS)[number];

export interface SurveyParse {
  format: SurveyFormat;
  points: ParsedSurveyPoint[];
}
