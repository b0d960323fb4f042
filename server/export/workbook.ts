/**
 * The estimator's workbook (exceljs): Summary (project, version, review state, cautions and the
 * "check with local codes and licensed practice" note on the front), Takeoff, Estimate (amounts
 * and totals as formulas, with their values cached so readers without a calculation engine see
 * them), Outlets, Pipes, Tank timeline (when the design has tanks to simulate) and Options.
 * Numbers are real numbers with formats, units sit in the headers, header rows are frozen.
 * Every quantity is in the project's unit system (US customary or SI) through engine/units.ts, the
 * same units the screens show; lengths bought by the metre are sold by the foot in US workbooks
 * (quantity in ft, unit price per ft), so each amount is unchanged.
 */
import ExcelJS from 'exceljs';
import type { DesignSummary, Estimate, NetworkDocument, SteadyResult, Takeoff, TimeSeriesResult } from '../../engine';
import { designChecks, pipeStaticPressures, soldUnit } from '../../engine';
import { toDisplay, unitDigits, unitLabel, type Quantity, type UnitSystem } from '../../engine/units';

export interface WorkbookInput {
  project: string;
  site: string;
  design: string;
  version: number;
  reviewState: string;
  currency: string;
  /** The project's unit system. */
  units: UnitSystem;
  document: NetworkDocument;
  steady: SteadyResult;
  takeoff: Takeoff;
  estimate: Estimate;
  timeline: TimeSeriesResult | null;
  options: { name: string; summary: DesignSummary | null; preferred: boolean }[];
  cautions: string[];
  generatedAt: Date;
}

export const CODES_NOTE =
  'Runnel is a design aid. Check this design with local codes and licensed practice before anyone buys pipe or digs a trench: pressure ratings, tank stands, backflow protection between drinking and stock water, trench safety and freeze protection are governed by local rules.';

const MONEY = (currency: string) => `#,##0.00 "${currency}"`;
/** Unit prices per foot run to fractions of a cent: show up to four places. */
const UNIT_PRICE = (currency: string) => `#,##0.00## "${currency}"`;

/** One quantity in the workbook's unit system: header label, number format, conversion from SI. */
export interface SheetUnits {
  system: UnitSystem;
  label(q: Quantity): string;
  fmt(q: Quantity, extraDigits?: number): string;
  /** SI → shown; null and undefined stay empty cells. */
  v(q: Quantity, si: number | null | undefined): number | null;
}

export function sheetUnits(system: UnitSystem): SheetUnits {
  return {
    system,
    label: (q) => unitLabel(q, system),
    fmt: (q, extra = 0) => {
      const d = unitDigits(q, system) + extra;
      return d > 0 ? `#,##0.${'0'.repeat(d)}` : '#,##0';
    },
    v: (q, si) => (si === null || si === undefined || !Number.isFinite(si) ? null : toDisplay(q, si, system)),
  };
}

function sheet(book: ExcelJS.Workbook, name: string, columns: { header: string; key: string; width: number; fmt?: string }[]): ExcelJS.Worksheet {
  const ws = book.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] });
  ws.columns = columns.map((c) => ({ header: c.header, key: c.key, width: c.width, style: c.fmt ? { numFmt: c.fmt } : {} }));
  ws.getRow(1).font = { bold: true };
  ws.getRow(1).alignment = { wrapText: true, vertical: 'top' };
  return ws;
}

export async function buildWorkbook(input: WorkbookInput): Promise<Buffer> {
  const book = new ExcelJS.Workbook();
  book.creator = 'Runnel';
  book.created = input.generatedAt;
  const money = MONEY(input.currency);
  const e = input.estimate;
  const u = sheetUnits(input.units);

  const summary = book.addWorksheet('Summary', { views: [{ state: 'frozen', ySplit: 1 }] });
  summary.columns = [
    { header: 'Item', key: 'k', width: 30 },
    { header: 'Value', key: 'v', width: 90 },
  ];
  summary.getRow(1).font = { bold: true };
  const rows: [string, string | number | Date][] = [
    ['Project', input.project],
    ['Site', input.site],
    ['Design', input.design],
    ['Network version', input.version],
    ['Review state', input.reviewState],
    ['Exported', input.generatedAt],
    ['Total estimate', e.total],
    ['Currency', input.currency],
    ['Important', CODES_NOTE],
    ['Units', input.units === 'us' ? 'US customary (ft, in, psi, gpm, ft/s)' : 'SI (m, mm, kPa, L/s, m/s)'],
  ];
  for (const [k, v] of rows) summary.addRow({ k, v });
  summary.getCell('B7').numFmt = 'yyyy-mm-dd hh:mm';
  summary.getCell('B8').numFmt = money;
  summary.getRow(10).font = { bold: true, color: { argb: 'FF9A3412' } };
  summary.addRow({});
  summary.addRow({ k: 'Cautions' }).font = { bold: true };
  for (const c of input.cautions) summary.addRow({ k: '', v: c });
  summary.getColumn('v').alignment = { wrapText: true, vertical: 'top' };

  const L = u.label('length');
  const t = sheet(book, 'Takeoff', [
    { header: 'Code', key: 'code', width: 26 },
    { header: 'Description', key: 'description', width: 36 },
    { header: 'Group', key: 'group', width: 10 },
    { header: 'Quantity', key: 'quantity', width: 12, fmt: '#,##0.###' },
    { header: 'Unit', key: 'unit', width: 8 },
    { header: `Network length (${L})`, key: 'network', width: 14, fmt: '#,##0.00' },
    { header: `With waste (${L})`, key: 'with_waste', width: 14, fmt: '#,##0.00' },
    { header: 'Pieces (coils or sticks)', key: 'pieces', width: 12, fmt: '0' },
    { header: `Piece length (${L})`, key: 'piece', width: 12, fmt: '0.00' },
    { header: 'Note', key: 'note', width: 30 },
    { header: 'From elements', key: 'elements', width: 40 },
  ]);
  for (const r of input.takeoff.rows) {
    const sold = soldUnit(r.unit, u.system);
    t.addRow({
      code: r.code,
      description: r.description,
      group: r.group,
      quantity: r.quantity * sold.perSi,
      unit: sold.unit,
      network: u.v('length', r.network_m),
      with_waste: u.v('length', r.with_waste_m),
      pieces: r.pieces ?? null,
      piece: r.piece_m ? u.v('length', r.piece_m) : null,
      note: r.note ?? '',
      elements: r.elements.join(', '),
    });
  }

  const est = sheet(book, 'Estimate', [
    { header: 'Code', key: 'code', width: 26 },
    { header: 'Description', key: 'description', width: 36 },
    { header: 'Quantity', key: 'quantity', width: 12, fmt: '#,##0.###' },
    { header: 'Unit', key: 'unit', width: 8 },
    { header: `Unit price (${input.currency})`, key: 'unit_price', width: 14, fmt: UNIT_PRICE(input.currency) },
    { header: `Amount (${input.currency})`, key: 'amount', width: 16, fmt: money },
    { header: 'Priced', key: 'priced', width: 10 },
  ]);
  e.lines.forEach((l, i) => {
    const r = i + 2;
    const sold = soldUnit(l.unit, u.system);
    est.addRow({
      code: l.code,
      description: l.description,
      quantity: l.quantity * sold.perSi,
      unit: sold.unit,
      unit_price: l.unit_price === null ? null : l.unit_price / sold.perSi,
      priced: l.unit_price === null ? 'NO PRICE' : 'yes',
    });
    est.getCell(`F${r}`).value = { formula: `IF(E${r}="",0,ROUND(C${r}*E${r},2))`, result: l.amount };
  });
  const last = e.lines.length + 1;
  const totalRow = (label: string, formula: string, value: number, bold = false): number => {
    const row = est.addRow({ description: label });
    est.getCell(`F${row.number}`).value = { formula, result: value };
    if (bold) row.font = { bold: true };
    return row.number;
  };
  est.addRow({});
  const mat = totalRow('Materials', `SUM(F2:F${last})`, e.materials, true);
  const labourRow = est.addRow({ description: 'Labour', quantity: e.settings.labour_hours, unit: 'h', unit_price: e.settings.labour_rate });
  est.getCell(`F${labourRow.number}`).value = { formula: `ROUND(C${labourRow.number}*E${labourRow.number},2)`, result: e.labour };
  const markupRow = est.addRow({ description: 'Markup', quantity: e.settings.markup_fraction, unit: 'share' });
  est.getCell(`C${markupRow.number}`).numFmt = '0.0%';
  est.getCell(`F${markupRow.number}`).value = { formula: `ROUND((F${mat}+F${labourRow.number})*C${markupRow.number},2)`, result: e.markup };
  const taxRow = est.addRow({ description: 'Tax', quantity: e.settings.tax_fraction, unit: 'share' });
  est.getCell(`C${taxRow.number}`).numFmt = '0.0%';
  est.getCell(`F${taxRow.number}`).value = { formula: `ROUND((F${mat}+F${labourRow.number}+F${markupRow.number})*C${taxRow.number},2)`, result: e.tax };
  totalRow('Total', `F${mat}+F${labourRow.number}+F${markupRow.number}+F${taxRow.number}`, e.total, true);

  const check = designChecks(input.document, input.steady, {});
  const P = u.label('pressure');
  const o = sheet(book, 'Outlets', [
    { header: 'Outlet', key: 'id', width: 12 },
    { header: 'Name', key: 'name', width: 30 },
    { header: `Elevation (${u.label('elevation')})`, key: 'elevation', width: 12, fmt: u.fmt('elevation') },
    { header: `Design flow (${u.label('flow')})`, key: 'flow', width: 12, fmt: u.fmt('flow') },
    { header: `Needs (${P})`, key: 'required', width: 12, fmt: u.fmt('pressure') },
    { header: `Pressure (${P})`, key: 'pressure', width: 12, fmt: u.fmt('pressure') },
    { header: `Margin (${P})`, key: 'margin', width: 12, fmt: u.fmt('pressure') },
    { header: 'Check', key: 'check', width: 10 },
  ]);
  for (const c of check.outlets) {
    const node = input.document.nodes.find((n) => n.id === c.id);
    o.addRow({
      id: c.id,
      name: c.name ?? '',
      elevation: u.v('elevation', node?.elevation_m),
      flow: node && node.kind === 'outlet' ? u.v('flow', node.demand_m3s) : null,
      required: u.v('pressure', c.required_m),
      pressure: u.v('pressure', c.pressure_m),
      margin: u.v('pressure', c.margin_m),
      check: c.passes ? 'passes' : 'FAILS',
    });
  }

  const statics = pipeStaticPressures(input.document);
  const p = sheet(book, 'Pipes', [
    { header: 'Pipe', key: 'id', width: 12 },
    { header: 'Name', key: 'name', width: 30 },
    { header: 'From', key: 'from', width: 8 },
    { header: 'To', key: 'to', width: 8 },
    { header: 'Series', key: 'series', width: 16 },
    { header: 'Size', key: 'nominal', width: 8 },
    { header: `Length (${L})`, key: 'length', width: 10, fmt: '#,##0.00' },
    { header: `Inside diameter (${u.label('diameter')})`, key: 'inside', width: 12, fmt: u.fmt('diameter') },
    { header: `Flow (${u.label('flow')})`, key: 'flow', width: 10, fmt: u.fmt('flow') },
    { header: `Velocity (${u.label('velocity')})`, key: 'velocity', width: 10, fmt: u.fmt('velocity') },
    { header: `Headloss (${u.label('head')})`, key: 'headloss', width: 10, fmt: u.fmt('head') },
    { header: `Static pressure (${P})`, key: 'static', width: 12, fmt: u.fmt('pressure') },
    { header: `Rating (${P})`, key: 'rating', width: 12, fmt: u.fmt('pressure') },
  ]);
  for (const l of input.document.links) {
    if (l.kind !== 'pipe') continue;
    const r = input.steady.links[l.id];
    p.addRow({
      id: l.id,
      name: l.name ?? '',
      from: l.from,
      to: l.to,
      series: l.series ?? '',
      nominal: l.nominal ?? '',
      length: u.v('length', l.length_m),
      inside: u.v('diameter', l.diameter_m),
      flow: u.v('flow', r?.flow_m3s),
      velocity: u.v('velocity', r?.velocity_ms),
      headloss: u.v('head', r?.headloss_m),
      static: u.v('pressure', statics.get(l.id)),
      rating: u.v('pressure', l.rating_m),
    });
  }

  if (input.timeline && Object.keys(input.timeline.tanks).length > 0) {
    const tanks = Object.keys(input.timeline.tanks);
    const tl = sheet(book, 'Tank timeline', [
      { header: 'Time (h)', key: 't', width: 10, fmt: '0.00' },
      ...tanks.map((id) => ({ header: `${id} level (${u.label('elevation')})`, key: id, width: 14, fmt: u.fmt('elevation', 1) })),
    ]);
    input.timeline.times_s.forEach((ts, i) =>
      tl.addRow({ t: ts / 3600, ...Object.fromEntries(tanks.map((id) => [id, u.v('elevation', input.timeline!.tanks[id].level_m[i])])) }),
    );
  }

  const op = sheet(book, 'Options', [
    { header: 'Design', key: 'name', width: 28 },
    { header: 'Preferred', key: 'preferred', width: 10 },
    { header: 'Lowest-margin outlet', key: 'outlet', width: 14 },
    { header: `Its pressure (${P})`, key: 'pressure', width: 12, fmt: u.fmt('pressure') },
    { header: `Margin (${P})`, key: 'margin', width: 10, fmt: u.fmt('pressure') },
    { header: `Worst velocity (${u.label('velocity')})`, key: 'velocity', width: 10, fmt: u.fmt('velocity') },
    { header: 'Highest static / rating', key: 'share', width: 12, fmt: '0%' },
    { header: 'Failing review checks', key: 'failing', width: 10, fmt: '0' },
    { header: 'Storage (days)', key: 'days', width: 10, fmt: '0.0' },
    { header: `Pipe cost (${input.currency})`, key: 'pipe', width: 14, fmt: money },
    { header: `Total estimate (${input.currency})`, key: 'total', width: 16, fmt: money },
  ]);
  for (const d of input.options) {
    const s = d.summary;
    op.addRow({
      name: d.name,
      preferred: d.preferred ? 'yes' : '',
      outlet: s?.lowestOutlet?.id ?? '',
      pressure: u.v('pressure', s?.lowestOutlet?.pressure_m),
      margin: u.v('pressure', s?.lowestOutlet?.margin_m),
      velocity: u.v('velocity', s?.worstVelocity?.velocity_ms),
      share: s?.worstRating?.share ?? null,
      failing: s?.failingChecks ?? null,
      days: s?.storageDays ?? null,
      pipe: s?.pipeCost ?? null,
      total: s?.total ?? null,
    });
  }
  return Buffer.from(await book.xlsx.writeBuffer());
}
