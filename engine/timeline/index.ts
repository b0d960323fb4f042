/**
 * Timeline: the series and events a simulated day or week shows (tank levels and bank volume,
 * pumps with their sun factor, outlets delivered against requested), as CSV too.
 * @example
 * const series = timelineSeries(doc, simulate(doc, { duration_s: 86400, step_s: 600 }));
 */
export { timelineSeries, sampleHour, type TimelineSeries } from './timeline-series';
export { bankEqualisation, BANK_TOLERANCE_M, type BankEqualisation } from './bank-equalisation';
export { timelineEvents, timelineCsv, LOW_BAND, type TimelineEvent, type TimelineEventKind } from './timeline-events';
