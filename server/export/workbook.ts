/**
 * The estimator's workbook (exceljs): Summary (project, version, review state, cautions and the
 * "check with local codes and licensed practice" note on the front), Takeoff, Estimate (amounts
 * and totals as formulas, with their values cached so readers without a calculation engine see
 * them), Outlets, Pipes, Tank timeline (when the design has tanks to simulate) and Options.
 * Numbers are real numbers with formats, units sit in the headers, header rows are frozen.
 */
import ExcelJS from 'exceljs';
import type { DesignSummary, Estimate, NetworkDocument, SteadyResult, Takeoff, TimeSeriesResult } from '../../engine';
import { designChecks, pipeStaticPressures } from '../../engine';

export interface WorkbookInput {
  project: string;
  site: string;
  design: string;
  version: number;
  reviewState: string;
  currency: string;
  document: NetworkDocument;
  steady: SteadyResult;
  takeoff: Takeoff;
  estimate: Estimate;
  timeline: TimeSeriesResult | null;
  options: { name: string; summary: DesignSummary | null; preferred: boolean }[];
  cautions: string[];
  generatedAt: Date;
}

export const CODES_NOTE = 'Runnel is a design aid. Check this design with local codes and licensed practice before anyone buys pipe or digs a trench: pressure ratings, tank stands, backflow protection between drinking and stock water, trench safety and freeze protection are governed by local rules.';

const MONEY = (currency: string) => `#,##0.00 "${currency}"`;

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

  const summary = book.addWorksheet('Summary', { views: [{ state: 'frozen', ySplit: 1 }] });
  summary.columns = [{ header: 'Item', key: 'k', width: 30 }, { header: 'Value', key: 'v', width: 90 }];
  summary.getRow(1).font = { bold: true };
  const rows: [string, string | number | Date][] = [
    ['Project', input.project], ['Site', input.site], ['Design', input.design], ['Network version', input.version], ['Review state', input.reviewState],
    ['Exported', input.generatedAt], ['Total estimate', e.total], ['Currency', input.currency], ['Important', CODES_NOTE],
  ];
  for (const [k, v] of rows) summary.addRow({ k, v });
  summary.getCell('B7').numFmt = 'yyyy-mm-dd hh:mm';
  summary.getCell('B8').numFmt = money;
  summary.getRow(10).font = { bold: true, color: { argb: 'FF9A3412' } };
  summary.addRow({});
  summary.addRow({ k: 'Cautions' }).font = { bold: true };
  for (const c of input.cautions) summary.addRow({ k: '', v: c });
  summary.getColumn('v').alignment = { wrapText: true, vertical: 'top' };

  const t = sheet(book, 'Takeoff', [
    { header: 'Code', key: 'code', width: 26 }, { header: 'Description', key: 'description', width: 36 }, { header: 'Group', key: 'group', width: 10 },
    { header: 'Quantity', key: 'quantity', width: 12, fmt: '#,##0.###' }, { header: 'Unit', key: 'unit', width: 8 },
    { header: 'Network length (m)', key: 'network_m', width: 14, fmt: '#,##0.00' }, { header: 'With waste (m)', key: 'with_waste_m', width: 14, fmt: '#,##0.00' },
    { header: 'Pieces (coils or sticks)', key: 'pieces', width: 12, fmt: '0' }, { header: 'Piece length (m)', key: 'piece_m', width: 12, fmt: '0.00' },
    { header: 'Note', key: 'note', width: 30 }, { header: 'From elements', key: 'elements', width: 40 },
  ]);
  for (const r of input.takeoff.rows) t.addRow({ ...r, elements: r.elements.join(', ') });

  const est = sheet(book, 'Estimate', [
    { header: 'Code', key: 'code', width: 26 }, { header: 'Description', key: 'description', width: 36 }, { header: 'Quantity', key: 'quantity', width: 12, fmt: '#,##0.###' },
    { header: 'Unit', key: 'unit', width: 8 }, { header: `Unit price (${input.currency})`, key: 'unit_price', width: 14, fmt: money },
    { header: `Amount (${input.currency})`, key: 'amount', width: 16, fmt: money }, { header: 'Priced', key: 'priced', width: 10 },
  ]);
  e.lines.forEach((l, i) => {
    const r = i + 2;
    est.addRow({ code: l.code, description: l.description, quantity: l.quantity, unit: l.unit, unit_price: l.unit_price ?? null, priced: l.unit_price === null ? 'NO PRICE' : 'yes' });
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
  const o = sheet(book, 'Outlets', [
    { header: 'Outlet', key: 'id', width: 12 }, { header: 'Name', key: 'name', width: 30 }, { header: 'Elevation (m)', key: 'elevation', width: 12, fmt: '0.00' },
    { header: 'Design flow (L/s)', key: 'flow', width: 12, fmt: '0.000' }, { header: 'Needs (m of water)', key: 'required', width: 12, fmt: '0.00' },
    { header: 'Pressure (m of water)', key: 'pressure', width: 12, fmt: '0.00' }, { header: 'Margin (m)', key: 'margin', width: 12, fmt: '0.00' }, { header: 'Check', key: 'check', width: 10 },
  ]);
  for (const c of check.outlets) {
    const node = input.document.nodes.find((n) => n.id === c.id);
    o.addRow({ id: c.id, name: c.name ?? '', elevation: node?.elevation_m, flow: node && node.kind === 'outlet' ? node.demand_m3s * 1000 : null, required: c.required_m, pressure: c.pressure_m, margin: c.margin_m, check: c.passes ? 'passes' : 'FAILS' });
  }

  const statics = pipeStaticPressures(input.document);
  const p = sheet(book, 'Pipes', [
    { header: 'Pipe', key: 'id', width: 12 }, { header: 'Name', key: 'name', width: 30 }, { header: 'From', key: 'from', width: 8 }, { header: 'To', key: 'to', width: 8 },
    { header: 'Series', key: 'series', width: 16 }, { header: 'Size', key: 'nominal', width: 8 }, { header: 'Length (m)', key: 'length', width: 10, fmt: '#,##0.00' },
    { header: 'Inside diameter (mm)', key: 'id_mm', width: 12, fmt: '0.0' }, { header: 'Flow (L/s)', key: 'flow', width: 10, fmt: '0.000' },
    { header: 'Velocity (m/s)', key: 'velocity', width: 10, fmt: '0.00' }, { header: 'Headloss (m)', key: 'headloss', width: 10, fmt: '0.00' },
    { header: 'Static pressure (m of water)', key: 'static', width: 12, fmt: '0.0' }, { header: 'Rating (m of water)', key: 'rating', width: 12, fmt: '0.0' },
  ]);
  for (const l of input.document.links) {
    if (l.kind !== 'pipe') continue;
    const r = input.steady.links[l.id];
    p.addRow({ id: l.id, name: l.name ?? '', from: l.from, to: l.to, series: l.series ?? '', nominal: l.nominal ?? '', length: l.length_m, id_mm: l.diameter_m * 1000,
      flow: r ? r.flow_m3s * 1000 : null, velocity: r?.velocity_ms ?? null, headloss: r?.headloss_m ?? null, static: statics.get(l.id) ?? null, rating: l.rating_m ?? null });
  }

  if (input.timeline && Object.keys(input.timeline.tanks).length > 0) {
    const tanks = Object.keys(input.timeline.tanks);
    const tl = sheet(book, 'Tank timeline', [{ header: 'Time (h)', key: 't', width: 10, fmt: '0.00' }, ...tanks.map((id) => ({ header: `${id} level (m)`, key: id, width: 14, fmt: '0.000' }))]);
    input.timeline.times_s.forEach((ts, i) => tl.addRow({ t: ts / 3600, ...Object.fromEntries(tanks.map((id) => [id, input.timeline!.tanks[id].level_m[i]])) }));
  }

  const op = sheet(book, 'Options', [
    { header: 'Design', key: 'name', width: 28 }, { header: 'Preferred', key: 'preferred', width: 10 }, { header: 'Lowest-margin outlet', key: 'outlet', width: 14 },
    { header: 'Its pressure (m of water)', key: 'pressure', width: 12, fmt: '0.00' }, { header: 'Margin (m)', key: 'margin', width: 10, fmt: '0.00' },
    { header: 'Worst velocity (m/s)', key: 'velocity', width: 10, fmt: '0.00' }, { header: 'Highest static / rating', key: 'share', width: 12, fmt: '0%' },
    { header: 'Failing review checks', key: 'failing', width: 10, fmt: '0' }, { header: 'Storage (days)', key: 'days', width: 10, fmt: '0.0' },
    { header: `Pipe cost (${input.currency})`, key: 'pipe', width: 14, fmt: money }, { header: `Total estimate (${input.currency})`, key: 'total', width: 16, fmt: money },
  ]);
  for (const d of input.options) {
    const s = d.summary;
    op.addRow({ name: d.name, preferred: d.preferred ? 'yes' : '', outlet: s?.lowestOutlet?.id ?? '', pressure: s?.lowestOutlet?.pressure_m ?? null, margin: s?.lowestOutlet?.margin_m ?? null,
      velocity: s?.worstVelocity?.velocity_ms ?? null, share: s?.worstRating?.share ?? null, failing: s?.failingChecks ?? null, days: s?.storageDays ?? null, pipe: s?.pipeCost ?? null, total: s?.total ?? null });
  }
  return Buffer.from(await book.xlsx.writeBuffer());
}
