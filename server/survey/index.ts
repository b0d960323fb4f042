/** Survey import: CSV or GPX, told apart by content (GPX is XML). */
import { parseSurveyCsv } from './parse-csv';
import { parseSurveyGpx } from './parse-gpx';
import type { SurveyFormat, SurveyParse } from './survey-point';

export { parseSurveyCsv } from './parse-csv';
export { parseSurveyGpx } from './parse-gpx';
export { SurveyError, METRES_PER_FOOT, type SurveyPoint, type SurveyParse, type SurveyFormat } from './survey-point';

/** 'gpx' when the text is XML, 'csv' when it is plain text, null for binary content. */
export function detectSurveyFormat(bytes: Buffer): SurveyFormat | null {
  if (bytes.includes(0)) return null;
  const text = bytes.toString('utf8');
  if (text.includes('\uFFFD')) return null;
  return /^\uFEFF?\s*</.test(text) ? 'gpx' : 'csv';
}

export function parseSurvey(text: string, format: SurveyFormat): SurveyParse {
  return format === 'gpx' ? parseSurveyGpx(text) : parseSurveyCsv(text);
}
