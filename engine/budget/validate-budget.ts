import type { UseKind } from './budget-document';
import { DEFAULT_RATES } from './defaults';
import { FIXTURE_BY_KEY, FIXTURES, fixtureUnits, MAX_FIXTURE_UNITS, type FixtureKey } from './fixtures';

/**
 * Structural validation of an untrusted budget document. Returns one message per problem, each
 * naming the row and field, e.g. `uses[2] "Ewes".count: must be a number ≥ 0 (got -3)`. Unknown
 * fields are ignored. [] means the budget can be planned.
 *
 * @example
 * validateBudget({ schema: 'runnel.budget/1', uses: [], peak_factor: 2, peak_sun_hours: Array(12).fill(5) }) // []
 */

const KINDS: UseKind[] = ['livestock', 'garden', 'tunnel', 'orchard', 'household', 'other'];

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const isNum = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const show = (v: unknown): string => (v === undefined ? 'nothing' : JSON.stringify(v));

export function validateBudget(doc: unknown): string[] {
  const out: string[] = [];
  if (!isObj(doc)) return ['budget: must be a JSON object'];
  if (doc['schema'] !== undefined && doc['schema'] !== 'runnel.budget/1') out.push(`schema: must be "runnel.budget/1" (got ${show(doc['schema'])})`);
  if (!isNum(doc['peak_factor']) || doc['peak_factor'] < 1) out.push(`peak_factor: must be a number ≥ 1 (got ${show(doc['peak_factor'])})`);
  const psh = doc['peak_sun_hours'];
  if (!Array.isArray(psh) || psh.length !== 12) out.push('peak_sun_hours: must be a list of 12 numbers (January first)');
  else
    psh.forEach((v, i) => {
      if (!isNum(v) || v < 0 || v > 12) out.push(`peak_sun_hours[${i}]: must be a number of hours 0–12 (got ${show(v)})`);
    });
  months(out, 'hot_months', doc['hot_months'], true);
  for (const key of ['storage_days', 'waste_allowance'] as const) {
    const v = doc[key];
    if (v !== undefined && (!isNum(v) || v < 0)) out.push(`${key}: must be a number ≥ 0 (got ${show(v)})`);
  }
  for (const key of ['manual_outlets', 'tanks'] as const) {
    const v = doc[key];
    if (v !== undefined && (!Array.isArray(v) || !v.every((s) => typeof s === 'string'))) out.push(`${key}: must be a list of element ids`);
  }
  if (doc['fill_pump'] !== undefined && typeof doc['fill_pump'] !== 'string') out.push(`fill_pump: must be a pump id (got ${show(doc['fill_pump'])})`);
  const rates = doc['rates'];
  if (rates !== undefined) {
    if (!isObj(rates)) out.push('rates: must be an object of overrides by row key');
    else
      for (const [key, row] of Object.entries(rates)) {
        if (!DEFAULT_RATES[key]) {
          out.push(`rates.${key}: no such row in the defaults table`);
          continue;
        }
        if (!isObj(row) || !isNum(row['rate']) || row['rate'] < 0) {
          out.push(`rates.${key}.rate: must be a number ≥ 0 (got ${show(isObj(row) ? row['rate'] : row)})`);
          continue;
        }
        if (row['hot_rate'] !== undefined && (!isNum(row['hot_rate']) || row['hot_rate'] < 0))
          out.push(`rates.${key}.hot_rate: must be a number ≥ 0 (got ${show(row['hot_rate'])})`);
      }
  }
  const uses = doc['uses'];
  if (!Array.isArray(uses)) {
    out.push('uses: must be a list of water uses');
    return out;
  }
  const ids = new Set<string>();
  uses.forEach((use, i) => validateUse(out, use, i, ids));
  return out;
}

function validateUse(out: string[], use: unknown, i: number, ids: Set<string>): void {
  if (!isObj(use)) {
    out.push(`uses[${i}]: must be an object`);
    return;
  }
  const name = typeof use['name'] === 'string' && use['name'].trim() ? use['name'] : undefined;
  const row = `uses[${i}]${name ? ` "${name}"` : ''}`;
  const bad = (field: string, message: string): void => {
    out.push(`${row}.${field}: ${message}`);
  };
  const id = use['id'];
  if (typeof id !== 'string' || !id.trim()) bad('id', `must be a non-empty string (got ${show(id)})`);
  else if (ids.has(id)) bad('id', `is used by another row (${id})`);
  else ids.add(id);
  if (!name) bad('name', 'must be a non-empty name');
  const kind = use['kind'] as UseKind;
  if (!KINDS.includes(kind)) {
    bad('kind', `must be one of ${KINDS.join(', ')} (got ${show(kind)})`);
    return;
  }
  months(out, `${row}.months`, use['months'], false);
  const outlets = use['outlets'];
  if (!Array.isArray(outlets) || !outlets.every((s) => typeof s === 'string')) bad('outlets', 'must be a list of outlet ids');
  const window = use['window_h'];
  if (window !== undefined && (!isNum(window) || window <= 0 || window > 24)) bad('window_h', `must be hours in (0, 24] (got ${show(window)})`);
  const key = use['rate_key'];
  if (key !== undefined && (typeof key !== 'string' || !DEFAULT_RATES[key])) bad('rate_key', `no such row in the defaults table (got ${show(key)})`);
  else if (typeof key === 'string' && DEFAULT_RATES[key].kind !== kind) bad('rate_key', `row ${key} is for ${DEFAULT_RATES[key].kind}, not ${kind}`);
  const nonNegative = (field: string): void => {
    const v = use[field];
    if (v !== undefined && (!isNum(v) || v < 0)) bad(field, `must be a number ≥ 0 (got ${show(v)})`);
  };
  const positive = (field: string, required: boolean): void => {
    const v = use[field];
    if (v === undefined && !required) return;
    if (!isNum(v) || v <= 0) bad(field, `must be a number > 0 (got ${show(v)})`);
  };
  nonNegative('rate_m3_day');
  nonNegative('hot_rate_m3_day');
  switch (kind) {
    case 'livestock':
    case 'orchard':
    case 'household': {
      const v = use['count'];
      if (!isNum(v) || v < 0 || !Number.isInteger(v)) bad('count', `must be a whole number ≥ 0 (got ${show(v)})`);
      if (kind === 'household' && use['fixtures'] !== undefined) validateFixtures(use['fixtures'], bad);
      break;
    }
    case 'garden':
    case 'tunnel':
      if (use['drip'] !== undefined) {
        validateDrip(use['drip'], bad);
        break;
      }
      positive('area_m2', true);
      positive('depth_m_day', false);
      positive('hot_depth_m_day', false);
      break;
    case 'other':
      nonNegative('daily_m3');
      if (!isNum(use['daily_m3'])) bad('daily_m3', `must be a number ≥ 0 (got ${show(use['daily_m3'])})`);
      break;
  }
}

function validateFixtures(v: unknown, bad: (field: string, message: string) => void): void {
  if (!isObj(v)) {
    bad('fixtures', 'must be counts of fixtures by kind');
    return;
  }
  for (const [key, n] of Object.entries(v)) {
    if (!FIXTURE_BY_KEY[key as FixtureKey]) bad(`fixtures.${key}`, `no such fixture (one of ${FIXTURES.map((f) => f.key).join(', ')})`);
    else if (!isNum(n) || n < 0 || !Number.isInteger(n)) bad(`fixtures.${key}`, `must be a whole number ≥ 0 (got ${show(n)})`);
  }
  const units = fixtureUnits(v as Record<FixtureKey, number>);
  if (units > MAX_FIXTURE_UNITS)
    bad('fixtures', `${units} fixture units is beyond this table (${MAX_FIXTURE_UNITS}); size a building this large with the plumbing code's full table`);
}

function validateDrip(v: unknown, bad: (field: string, message: string) => void): void {
  if (!isObj(v)) {
    bad('drip', 'must describe the rows (rows, row_length_m, run_h and an emitter or tape flow)');
    return;
  }
  const rows = v['rows'];
  if (!isNum(rows) || rows < 1 || !Number.isInteger(rows)) bad('drip.rows', `must be a whole number ≥ 1 (got ${show(rows)})`);
  for (const f of ['row_length_m', 'run_h'] as const) if (!isNum(v[f]) || (v[f] as number) <= 0) bad(`drip.${f}`, `must be a number > 0 (got ${show(v[f])})`);
  for (const f of ['run_h', 'hot_run_h'] as const) if (isNum(v[f]) && (v[f] as number) > 24) bad(`drip.${f}`, `must be hours in (0, 24] (got ${show(v[f])})`);
  if (v['hot_run_h'] !== undefined && (!isNum(v['hot_run_h']) || v['hot_run_h'] <= 0))
    bad('drip.hot_run_h', `must be a number > 0 (got ${show(v['hot_run_h'])})`);
  const tape = v['tape_flow_m3s_per_m'];
  const emitter = v['emitter_flow_m3s'] !== undefined || v['emitter_spacing_m'] !== undefined;
  if (tape !== undefined && emitter) {
    bad('drip', 'give either emitters (spacing and flow) or tape flow per length, not both');
    return;
  }
  if (tape !== undefined) {
    if (!isNum(tape) || tape <= 0) bad('drip.tape_flow_m3s_per_m', `must be a number > 0 (got ${show(tape)})`);
    return;
  }
  if (!emitter) {
    bad('drip', 'give the emitter spacing and flow, or the tape flow per length');
    return;
  }
  for (const f of ['emitter_spacing_m', 'emitter_flow_m3s'] as const)
    if (!isNum(v[f]) || (v[f] as number) <= 0) bad(`drip.${f}`, `must be a number > 0 (got ${show(v[f])})`);
}

function months(out: string[], field: string, v: unknown, optional: boolean): void {
  if (v === undefined && optional) return;
  if (!Array.isArray(v)) {
    out.push(`${field}: must be a list of months 1–12`);
    return;
  }
  v.forEach((m, j) => {
    if (!isNum(m) || !Number.isInteger(m) || m < 1 || m > 12) out.push(`${field}[${j}]: must be a whole month 1–12 (got ${show(m)})`);
  });
}
