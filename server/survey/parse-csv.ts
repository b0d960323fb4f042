/**
 * Survey points from CSV. A header row names the columns (any case, spaces or dashes allowed):
 * label | name | id | point, x | easting, y | northing, lat | latitude, lon | lng | long | longitude,
 * elevation | elev | z | ele | height. A header suffix _ft or _m (e.g. `elevation_ft`) or a
 * `units` column (ft, feet, foot, m, metre(s), meter(s)) gives the length unit; the default is metres.
 * Each point needs an elevation and either x and y or lat and lon.
 *
 * @example
 * parseSurveyCsv('label,easting,northing,elev_ft\nA,0,0,100\n')
 * // → { format: 'csv', points: [{ label: 'A', x_m: 0, y_m: 0, elevation_m: 30.48 }] }
 */
import Papa from 'papaparse';
import { METRES_PER_FOOT, SurveyError, type SurveyParse, type SurveyPoint } from './survey-point';

type Field = 'label' | 'x' | 'y' | 'lat' | 'lon' | 'elevation' | 'units';
type Unit = 'ft' | 'm';

const ALIASES: Record<Field, string[]> = {
  label: ['label', 'name', 'id', 'point', 'station'],
  x: ['x', 'easting', 'east'],
  y: ['y', 'northing', 'north'],
  lat: ['lat', 'latitude'],
  lon: ['lon', 'lng', 'long', 'longitude'],
  elevation: ['elevation', 'elev', 'z', 'ele', 'height', 'altitude'],
  units: ['units', 'unit'],
};

const UNIT_WORDS: Record<string, Unit> = {
  ft: 'ft',
  feet: 'ft',
  foot: 'ft',
  "'": 'ft',
  us: 'ft',
  m: 'm',
  metre: 'm',
  metres: 'm',
  meter: 'm',
  meters: 'm',
  si: 'm',
};

interface Column {
  index: number;
  unit?: Unit;
}

function readHeader(cells: string[]): Partial<Record<Field, Column>> {
  const columns: Partial<Record<Field, Column>> = {};
  cells.forEach((cell, index) => {
    let name = cell
      .trim()
      .toLowerCase()
      .replace(/[\s-]+/g, '_')
      .replace(/[()]/g, '');
    let unit: Unit | undefined;
    const suffix = /_(ft|m)$/.exec(name);
    if (suffix && name.length > suffix[0].length) {
      unit = suffix[1] as Unit;
      name = name.slice(0, -suffix[0].length);
    }
    for (const field of Object.keys(ALIASES) as Field[]) {
      if (!columns[field] && ALIASES[field].includes(name)) columns[field] = { index, unit };
    }
  });
  return columns;
}

export function parseSurveyCsv(text: string): SurveyParse {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
  const rows = parsed.data;
  const headerIndex = rows.findIndex((r) => r.some((c) => c.trim() !== ''));
  if (headerIndex < 0) throw new SurveyError('line 1: the file is empty; expected a header row', { line: 1 });
  const headerLine = headerIndex + 1;
  const columns = readHeader(rows[headerIndex]);
  if (!columns.elevation) {
    throw new SurveyError(`line ${headerLine}: no elevation column (name one elevation, elev, z or ele)`, { line: headerLine });
  }
  const planar = columns.x && columns.y;
  const geographic = columns.lat && columns.lon;
  if (!planar && !geographic) {
    throw new SurveyError(`line ${headerLine}: need x and y (or easting and northing) columns, or lat and lon`, { line: headerLine });
  }
  const points: SurveyPoint[] = [];
  for (let r = headerIndex + 1; r < rows.length; r++) {
    const cells = rows[r];
    if (cells.every((c) => c.trim() === '')) continue;
    // Rows are one per line unless a quoted cell spans lines, which survey exports do not produce.
    const line = r + 1;
    const cell = (column: Column | undefined) => (column ? (cells[column.index] ?? '').trim() : '');
    let rowUnit: Unit = 'm';
    if (columns.units) {
      const word = cell(columns.units).toLowerCase();
      if (word) {
        const unit = UNIT_WORDS[word];
        if (!unit) throw new SurveyError(`line ${line}: units "${word}" is not ft or m`, { line });
        rowUnit = unit;
      }
    }
    const length = (field: 'x' | 'y' | 'elevation'): number | undefined => {
      const column = columns[field];
      const raw = cell(column);
      if (raw === '') return undefined;
      const value = Number(raw);
      if (!Number.isFinite(value)) throw new SurveyError(`line ${line}: ${field} "${raw}" is not a number`, { line });
      return (column?.unit ?? rowUnit) === 'ft' ? value * METRES_PER_FOOT : value;
    };
    const degrees = (field: 'lat' | 'lon', limit: number): number | undefined => {
      const raw = cell(columns[field]);
      if (raw === '') return undefined;
      const value = Number(raw);
      if (!Number.isFinite(value)) throw new SurveyError(`line ${line}: ${field} "${raw}" is not a number`, { line });
      if (Math.abs(value) > limit) throw new SurveyError(`line ${line}: ${field} ${value} is outside ±${limit}°`, { line });
      return value;
    };
    const elevation = length('elevation');
    if (elevation === undefined) throw new SurveyError(`line ${line}: elevation is missing`, { line });
    const point: SurveyPoint = { elevation_m: elevation };
    const label = cell(columns.label);
    if (label) point.label = label;
    const x = length('x');
    const y = length('y');
    const lat = degrees('lat', 90);
    const lon = degrees('lon', 180);
    if (x !== undefined && y !== undefined) {
      point.x_m = x;
      point.y_m = y;
    }
    if (lat !== undefined && lon !== undefined) {
      point.lat = lat;
      point.lon = lon;
    }
    if (point.x_m === undefined && point.lat === undefined) {
      throw new SurveyError(`line ${line}: position is missing (need ${planar ? 'x and y' : 'lat and lon'})`, { line });
    }
    points.push(point);
  }
  if (points.length === 0) throw new SurveyError(`line ${headerLine + 1}: no points after the header`, { line: headerLine + 1 });
  return { format: 'csv', points };
}
