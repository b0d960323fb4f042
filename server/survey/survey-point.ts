/** A surveyed ground point, in metres (x/y on the site plan) or degrees (lat/lon): one type, shared with the client. */
export type { ParsedSurveyPoint as SurveyPoint, SurveyFormat, SurveyParse } from '../../engine/survey-point';

/** A parse failure naming where: `line` (CSV, 1-based, header is line 1) or `point` (GPX, 1-based). */
export class SurveyError extends Error {
  constructor(
    message: string,
    readonly where: { line: number } | { point: number },
  ) {
    super(message);
  }
}

/** International foot (exact, NIST SP 811), from engine/units.ts where unit factors live. */
export { FOOT_M as METRES_PER_FOOT } from '../../engine/units';
