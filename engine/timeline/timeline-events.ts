import type { NetworkDocument, PumpLink } from '../network-document';
import type { TimelineSeries } from './timeline-series';

/**
 * Events on a Timeline, read from its series: a tank falling into its low band (the lowest 20 %
 * between min and max level, our warning band), running empty (at its min level), filling to the
 * top and overflowing (at max level while a pump still delivers); a pump stopping and restarting
 * (at its control levels, at the low-water cut-off, or with the sun); an outlet falling short
 * (delivering under 99 % of its request, the engine's unmet-demand rule) and recovering.
 * Each event keeps the first sample at which it holds.
 *
 * @example
 * timelineEvents(doc, timelineSeries(doc, simulate(doc, { duration_s: 7 * 86400, step_s: 600 })))
 */

export type TimelineEventKind =
  'tank-low' | 'tank-empty' | 'tank-full' | 'overflow' | 'pump-stop' | 'pump-start' | 'low-cutoff' | 'outlet-short' | 'outlet-recovered';

export interface TimelineEvent {
  time_s: number;
  kind: TimelineEventKind;
  element: string;
  message: string;
}

/** Share of the min–max band counted as "low". */
export const LOW_BAND = 0.2;
const EPS_M = 1e-3;
/** A pump stopping or starting this close to a control level is put down to it (a sample may fall after the switch). */
const REASON_M = 0.05;

export function timelineEvents(doc: NetworkDocument, s: TimelineSeries): TimelineEvent[] {
  const out: TimelineEvent[] = [];
  const n = s.times_s.length;
  const name = (id: string): string => doc.nodes.find((x) => x.id === id)?.name ?? doc.links.find((x) => x.id === id)?.name ?? id;
  const pumpsInto = (tank: string): string[] => doc.links.filter((l) => l.kind === 'pump' && l.to === tank).map((l) => l.id);
  for (const [id, tank] of Object.entries(s.tanks)) {
    const low = tank.min_level_m + LOW_BAND * (tank.max_level_m - tank.min_level_m);
    const feeding = pumpsInto(id);
    let wasLow = tank.level_m[0] <= low;
    let wasEmpty = tank.level_m[0] <= tank.min_level_m + EPS_M;
    let wasFull = tank.level_m[0] >= tank.max_level_m - EPS_M;
    let wasOver = false;
    for (let i = 1; i < n; i++) {
      const l = tank.level_m[i];
      const t = s.times_s[i];
      const isLow = l <= low;
      const isEmpty = l <= tank.min_level_m + EPS_M;
      const isFull = l >= tank.max_level_m - EPS_M;
      const isOver = isFull && feeding.some((p) => (s.pumps[p]?.flow_m3s[i] ?? 0) > 1e-9);
      if (isLow && !wasLow && !isEmpty) out.push({ time_s: t, kind: 'tank-low', element: id, message: `${name(id)} is low (${l.toFixed(2)} m)` });
      if (isEmpty && !wasEmpty) out.push({ time_s: t, kind: 'tank-empty', element: id, message: `${name(id)} ran empty` });
      if (isFull && !wasFull) out.push({ time_s: t, kind: 'tank-full', element: id, message: `${name(id)} is full` });
      if (isOver && !wasOver) out.push({ time_s: t, kind: 'overflow', element: id, message: `${name(id)} overflows while the pump runs` });
      wasLow = isLow;
      wasEmpty = isEmpty;
      wasFull = isFull;
      wasOver = isOver;
    }
  }
  for (const link of doc.links) {
    if (link.kind !== 'pump' || !s.pumps[link.id]) continue;
    const p = link as PumpLink;
    const series = s.pumps[p.id];
    for (let i = 1; i < n; i++) {
      if (series.on[i] === series.on[i - 1]) continue;
      const t = s.times_s[i];
      const level = (tank: string): number | undefined => s.tanks[tank]?.level_m[i];
      if (!series.on[i]) {
        const cut = p.low_cutoff && (level(p.low_cutoff.tank) ?? Infinity) <= p.low_cutoff.level_m + EPS_M;
        const stop = p.control && (level(p.control.tank) ?? -Infinity) >= p.control.stop_level_m - REASON_M;
        if (cut) out.push({ time_s: t, kind: 'low-cutoff', element: p.id, message: `${name(p.id)} stops at the low-water cut-off` });
        else
          out.push({
            time_s: t,
            kind: 'pump-stop',
            element: p.id,
            message: `${name(p.id)} stops ${stop ? 'at the stop level' : series.sun[i] === 0 ? '(no sun)' : ''}`.trim(),
          });
      } else {
        const sunUp = series.sun[i - 1] === 0 && series.sun[i] > 0;
        const start = p.control && (level(p.control.tank) ?? Infinity) <= p.control.start_level_m + REASON_M;
        out.push({
          time_s: t,
          kind: 'pump-start',
          element: p.id,
          message: `${name(p.id)} starts ${sunUp ? '(sun up)' : start ? 'at the start level' : ''}`.trim(),
        });
      }
    }
  }
  for (const [id, o] of Object.entries(s.outlets)) {
    let short = false;
    for (let i = 1; i < n; i++) {
      const req = o.requested_m3s[i];
      const isShort = req > 1e-12 && o.delivered_m3s[i] < 0.99 * req;
      if (isShort && !short)
        out.push({
          time_s: s.times_s[i],
          kind: 'outlet-short',
          element: id,
          message: `${name(id)} delivers ${Math.round((100 * o.delivered_m3s[i]) / req)} % of its request`,
        });
      if (!isShort && short && req > 1e-12)
        out.push({ time_s: s.times_s[i], kind: 'outlet-recovered', element: id, message: `${name(id)} is back to full flow` });
      if (req > 1e-12) short = isShort;
    }
  }
  return out.sort((a, b) => a.time_s - b.time_s);
}

/** The series as CSV text (hours, then one column per series with its SI unit in the header). */
export function timelineCsv(s: TimelineSeries): string {
  const cols: { head: string; values: (i: number) => number | string }[] = [{ head: 'time_h', values: (i) => (s.times_s[i] / 3600).toFixed(4) }];
  for (const [id, t] of Object.entries(s.tanks)) cols.push({ head: `${id} level_m`, values: (i) => t.level_m[i] });
  cols.push({ head: 'bank volume_m3', values: (i) => s.bank_volume_m3[i] });
  for (const [id, p] of Object.entries(s.pumps)) {
    cols.push({ head: `${id} flow_m3s`, values: (i) => p.flow_m3s[i] });
    cols.push({ head: `${id} on`, values: (i) => (p.on[i] ? 1 : 0) });
    cols.push({ head: `${id} sun factor`, values: (i) => p.sun[i] });
  }
  for (const [id, o] of Object.entries(s.outlets)) {
    cols.push({ head: `${id} delivered_m3s`, values: (i) => o.delivered_m3s[i] });
    cols.push({ head: `${id} requested_m3s`, values: (i) => o.requested_m3s[i] });
  }
  const rows = [cols.map((c) => csvCell(c.head)).join(',')];
  for (let i = 0; i < s.times_s.length; i++) rows.push(cols.map((c) => c.values(i)).join(','));
  return `${rows.join('\n')}\n`;
}

function csvCell(v: string): string {
  return /[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}
