import { expect } from 'chai';
import {
  applyBudget,
  demandFromFixtureUnits,
  fixturePeak,
  layoutDifferences,
  planBudget,
  BudgetInputError,
  DEFAULT_RATES,
  validateBudget,
  type BudgetDocument,
  type BudgetUse,
} from '../../engine/budget';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { hillSmallholdingBudget } from '../../engine/examples/hill-smallholding-budget';
import type { NetworkDocument } from '../../engine/network-document';
import { solve } from '../../engine/steady';

// Conversions used to state the expected values in the sources' own units (exact by definition, NIST SP 811).
const GAL = 3.785411784e-3;
const FT2 = 0.09290304;
const IN = 0.0254;
const ALL = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];

function budget(uses: BudgetUse[], extra: Partial<BudgetDocument> = {}): BudgetDocument {
  return { schema: 'runnel.budget/1', peak_factor: 2.5, hot_months: [7], peak_sun_hours: Array(12).fill(5), uses, ...extra };
}

describe('water budget: per-unit needs against published figures', () => {
  it('sheep: 3.6 L/day in winter, 14 L/day in summer per head (Agriculture and Agri-Food Canada, V)', () => {
    const plan = planBudget(budget([{ id: 's', name: 'Flock', kind: 'livestock', rate_key: 'sheep', count: 40, months: ALL, outlets: [] }]));
    expect(plan.uses[0].monthly_m3_day[0]).to.be.closeTo(40 * 3.6e-3, 1e-12);
    expect(plan.uses[0].monthly_m3_day[6]).to.be.closeTo(40 * 14e-3, 1e-12);
  });
  it('horse 36/55 L/day and dry beef cow 10.8/13.4 gal/day (AAFC, V; Oklahoma State via K-State, V2)', () => {
    expect(DEFAULT_RATES['horse'].rate).to.be.closeTo(0.036, 1e-12);
    expect(DEFAULT_RATES['horse'].hot_rate).to.be.closeTo(0.055, 1e-12);
    expect(DEFAULT_RATES['beef-cow-dry'].hot_rate / GAL).to.be.closeTo(13.4, 1e-9);
    expect(DEFAULT_RATES['beef-cow-calf'].hot_rate / GAL).to.be.closeTo(20, 1e-9);
  });
  it('greenhouse at 0.4 gal/ft²·day peak: 1,000 ft² needs 400 gal/day (UMass Extension, V2)', () => {
    const plan = planBudget(budget([{ id: 'g', name: 'House', kind: 'tunnel', rate_key: 'greenhouse', area_m2: 1000 * FT2, months: ALL, outlets: [] }]));
    expect(plan.uses[0].monthly_m3_day[6] / GAL).to.be.closeTo(400, 1e-6);
    expect(plan.uses[0].monthly_m3_day[0] / GAL).to.be.closeTo(300, 1e-6);
  });
  it('depth arithmetic: 1 in over 1 ft² = 0.623 gal and 1 acre-inch = 27,154 gal (standard conversions, V2)', () => {
    const perFt2 = planBudget(budget([{ id: 'a', name: 'Bed', kind: 'garden', area_m2: FT2, depth_m_day: IN, months: ALL, outlets: [] }]));
    expect(perFt2.uses[0].monthly_m3_day[0] / GAL).to.be.closeTo(0.623, 0.0005);
    const acre = planBudget(budget([{ id: 'a', name: 'Field', kind: 'garden', area_m2: 4046.8564224, depth_m_day: IN, months: ALL, outlets: [] }]));
    expect(acre.uses[0].monthly_m3_day[0] / GAL).to.be.closeTo(27154, 1);
  });
  it('fruit tree worked example: 10 ft² canopy at 0.20 in/day = 1.25 gal/day (Vossen, UC Cooperative Extension, V2)', () => {
    const plan = planBudget(budget([{ id: 't', name: 'Canopy', kind: 'garden', area_m2: 10 * FT2, depth_m_day: 0.2 * IN, months: ALL, outlets: [] }]));
    expect(plan.uses[0].monthly_m3_day[0] / GAL).to.be.closeTo(1.25, 0.01);
  });
  it('a project override of a defaults row replaces the table figure and names its source', () => {
    const plan = planBudget(
      budget([{ id: 's', name: 'Flock', kind: 'livestock', rate_key: 'sheep', count: 10, months: ALL, outlets: [] }], {
        rates: { sheep: { rate: 0.005, hot_rate: 0.02, source: 'our own meter, 2025' } },
      }),
    );
    expect(plan.uses[0].rate_from).to.equal('project');
    expect(plan.uses[0].source).to.equal('our own meter, 2025');
    expect(plan.uses[0].monthly_m3_day[6]).to.be.closeTo(0.2, 1e-12);
  });
});

describe('water budget: totals and outlet flows (hand-worked, C)', () => {
  const cows: BudgetUse = { id: 'cows', name: 'Cows', kind: 'livestock', rate_key: 'beef-cow-dry', count: 30, months: ALL, outlets: ['TR'], window_h: 4 };
  it('30 dry cows at 13.4 gal/day, 4 h refill, +10 %: 402 × 1.1 / 240 min = 1.8425 gpm (Ohio State ANR-12; Nebraska NRCS 2008, V2)', () => {
    const plan = planBudget(budget([cows]));
    const tr = plan.outlets.find((o) => o.id === 'TR');
    expect(tr?.shares).to.have.length(1);
    expect(((tr?.design_flow_m3s ?? 0) * 60) / GAL).to.be.closeTo(1.8425, 1e-6);
    expect(tr?.shares[0].source).to.match(/Ohio State ANR-12/);
  });
  it('the 24 h minimum delivers the same day in 24 h: 402 × 1.1 / 1440 min = 0.3071 gpm', () => {
    const plan = planBudget(budget([{ ...cows, window_h: 24 }]));
    expect((plan.outlets[0].design_flow_m3s * 60) / GAL).to.be.closeTo(0.30708, 1e-5);
    expect(plan.outlets[0].shares[0].source).to.match(/Nebraska/);
  });
  it('a use shared by two outlets splits equally; an outlet serving two uses sums them', () => {
    const plan = planBudget(
      budget([
        { ...cows, outlets: ['A', 'B'] },
        { id: 'h', name: 'House', kind: 'other', daily_m3: 0.72, months: ALL, outlets: ['B'], window_h: 2 },
      ]),
    );
    const a = plan.outlets.find((o) => o.id === 'A');
    const b = plan.outlets.find((o) => o.id === 'B');
    expect(b!.design_flow_m3s - a!.design_flow_m3s).to.be.closeTo(0.72 / 7200, 1e-15);
    expect(a!.daily_m3 * 2).to.be.closeTo(30 * 13.4 * GAL, 1e-12);
  });
  it('monthly totals respect seasons; peak-hour flow = average × peak factor', () => {
    const plan = planBudget(budget([{ id: 'o', name: 'Wash', kind: 'other', daily_m3: 86.4, months: [5, 6], outlets: [] }]));
    expect(plan.months.map((m) => m.daily_m3)).to.deep.equal([0, 0, 0, 0, 86.4, 86.4, 0, 0, 0, 0, 0, 0]);
    expect(plan.months[4].peak_flow_m3s).to.be.closeTo(0.001 * 2.5, 1e-15);
    expect(plan.peak_month).to.equal(5);
  });
  it('applyBudget sets linked outlets and leaves "not from budget" outlets as typed', () => {
    const plan = planBudget({ ...hillSmallholdingBudget, manual_outlets: ['HYD', 'TR1'] }, hillSmallholding);
    const applied = applyBudget(hillSmallholding, plan);
    const node = (id: string) => applied.nodes.find((n) => n.id === id) as { demand_m3s: number };
    const original = (id: string) => hillSmallholding.nodes.find((n) => n.id === id) as { demand_m3s: number };
    expect(node('TR1').demand_m3s).to.equal(original('TR1').demand_m3s);
    expect(node('TR2').demand_m3s).to.be.closeTo(plan.outlets.find((o) => o.id === 'TR2')!.design_flow_m3s, 1e-18);
    expect(node('HYD').demand_m3s).to.equal(original('HYD').demand_m3s);
  });
  it('raising a head count raises the linked trough flow and lowers its pressure', () => {
    const more = { ...hillSmallholdingBudget, uses: hillSmallholdingBudget.uses.map((u) => (u.id === 'herd' ? { ...u, count: 40 } : u)) };
    const before = applyBudget(hillSmallholding, planBudget(hillSmallholdingBudget, hillSmallholding));
    const after = applyBudget(hillSmallholding, planBudget(more, hillSmallholding));
    const flow = (d: NetworkDocument) => (d.nodes.find((n) => n.id === 'TR4') as { demand_m3s: number }).demand_m3s;
    expect(flow(after)).to.be.closeTo(flow(before) * 4, 1e-15);
    expect(solve(after).nodes['TR4'].pressure_m).to.be.below(solve(before).nodes['TR4'].pressure_m);
  });
  it('a flow edited on the Layout is told apart from one that follows the budget, and a hold keeps it', () => {
    const seeded = applyBudget(hillSmallholding, planBudget(hillSmallholdingBudget, hillSmallholding));
    const edited: NetworkDocument = { ...seeded, nodes: seeded.nodes.map((n) => (n.id === 'TR3' ? { ...n, demand_m3s: 0.0005 } : n)) };
    const more = { ...hillSmallholdingBudget, uses: hillSmallholdingBudget.uses.map((u) => (u.id === 'herd' ? { ...u, count: 20 } : u)) };
    const plan = planBudget(more, edited);
    // TR4 still carries the old budget's flow (follows it); TR3 was edited; nothing else changes
    const diffs = layoutDifferences(edited, hillSmallholdingBudget, plan);
    expect(diffs.map((d) => [d.id, d.reason])).to.deep.equal([['TR3', 'edited-on-layout']]);
    expect(diffs[0].previous_m3s).to.be.closeTo(plan.outlets.find((o) => o.id === 'TR4')!.design_flow_m3s / 2, 1e-15);
    const applied = applyBudget(edited, plan, new Set(diffs.map((d) => d.id)));
    const flow = (id: string) => (applied.nodes.find((n) => n.id === id) as { demand_m3s: number }).demand_m3s;
    expect(flow('TR3')).to.equal(0.0005);
    expect(flow('TR4')).to.be.closeTo(plan.outlets.find((o) => o.id === 'TR4')!.design_flow_m3s, 1e-18);
    // with no previous budget every differing linked outlet counts as typed on the Layout
    const fresh = layoutDifferences(hillSmallholding, null, planBudget(hillSmallholdingBudget, hillSmallholding));
    // every linked outlet of the demo budget (all but the hydrant, kept as typed) differs from the flow typed in the demo network
    expect(fresh.map((d) => d.id).sort()).to.deep.equal(['GARDEN', 'HOUSE', 'ORCH-N', 'ORCH-S', 'SHED', 'TR1', 'TR2', 'TR3', 'TR4']);
    expect(fresh.every((d) => d.reason === 'not-yet-from-budget' && d.previous_m3s === null)).to.equal(true);
    // worked by hand (C): 120 ewes × 14 L/day in summer (AAFC, V) × 1.1, delivered in 4 h (Ohio State ANR-12;
    // Nebraska NRCS 2008, V2), split over two troughs = 1848 L / 14,400 s / 2 = 0.06417 L/s
    const by = (id: string) => fresh.find((d) => d.id === id)!;
    expect(by('TR1').budget_m3s).to.be.closeTo((120 * 0.014 * 1.1) / (4 * 3600) / 2, 1e-12);
    // 10 cow-calf pairs × 20 gal/day (NRCS Kansas 15–20, V2) × 1.1 in 4 h over two troughs = 0.4583 gpm each
    expect((by('TR3').budget_m3s * 60) / GAL).to.be.closeTo((10 * 20 * 1.1) / 240 / 2, 1e-9);
    expect(by('TR1').network_m3s).to.equal(0.0001); // the 0.1 L/s typed in examples/hill-smallholding.ts
  });
});

describe('water budget: storage and fill (hand-worked, C)', () => {
  // one 2 m tank, 0.2–2.2 m: usable π·1²·2 = 6.2832 m³; a solar pump of 0.5 L/s at 5 peak-sun hours fills 9 m³/day
  const net: NetworkDocument = {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'W', kind: 'source', elevation_m: 0, head_m: 0 },
      { id: 'T', kind: 'tank', elevation_m: 20, diameter_m: 2, level_m: 1, min_level_m: 0.2, max_level_m: 2.2 },
      { id: 'O', kind: 'outlet', elevation_m: 5, demand_m3s: 0 },
    ],
    links: [
      {
        id: 'PU',
        kind: 'pump',
        from: 'W',
        to: 'T',
        flow_m3s: 0.0005,
        schedule: Array(24)
          .fill(0)
          .map((_, h) => (h >= 8 && h < 16 ? 1 : 0)),
      },
      { id: 'P', kind: 'pipe', from: 'T', to: 'O', length_m: 100, diameter_m: 0.05, roughness: 150 },
    ],
  };
  const uses = (daily: number): BudgetUse[] => [{ id: 'u', name: 'Use', kind: 'other', daily_m3: daily, months: ALL, outlets: ['O'] }];
  it('enough: 1.5 m³/day against 9 m³/day of fill and 4.19 days of reserve', () => {
    const plan = planBudget(budget(uses(1.5)), net);
    expect(plan.storage?.usable_m3).to.be.closeTo(2 * Math.PI, 1e-9);
    const v = plan.verdicts![0];
    expect(v.daily_fill_m3).to.be.closeTo(9, 1e-9);
    expect(v.reserve_days).to.be.closeTo((2 * Math.PI) / 1.5, 1e-9);
    expect(v.status).to.equal('enough');
    expect(v.required_days).to.equal(3);
    expect(v.source).to.match(/SD2006-1/);
  });
  it('storage below 3 days for a solar source (NRCS SD2006-1, V2): 4 m³/day holds 1.57 days', () => {
    const v = planBudget(budget(uses(4)), net).verdicts![0];
    expect(v.status).to.equal('storage-low');
    expect(v.reserve_days).to.be.closeTo(1.5708, 1e-4);
  });
  it('an undersized pump is named with the month and the shortfall', () => {
    const plan = planBudget(budget(uses(10), { peak_sun_hours: [5, 5, 5, 5, 5, 5, 2, 5, 5, 5, 5, 5] }), net);
    expect(plan.verdicts![6].status).to.equal('short-and-storage-low');
    expect(plan.verdicts![6].balance_m3).to.be.closeTo(0.0005 * 2 * 3600 - 10, 1e-9);
    expect(plan.warnings).to.include('PU: fill pump too small in Jul: fills 3,600 L/day for a need of 10,000 L/day (short by 6,400 L/day)');
  });
  it('a pump on a curve fills at its flow at the lift, as the steady solve gives it', () => {
    const curved: NetworkDocument = {
      ...net,
      links: net.links.map((l) => (l.kind === 'pump' ? { id: 'PU', kind: 'pump', from: 'W', to: 'T', curve: [[0.001, 25]] } : l)),
    };
    const plan = planBudget(budget(uses(1)), curved);
    expect(plan.fill?.flow_from).to.equal('solve');
    expect(plan.fill?.flow_m3s).to.be.closeTo(solve(curved).links['PU'].flow_m3s, 1e-12);
    // no schedule: a mains-powered pump runs all day; storage asks 2 days or 6 h of peak (Canadian fact sheet, V2)
    expect(plan.verdicts![0].daily_fill_m3).to.be.closeTo(plan.fill!.flow_m3s * 86400, 1e-6);
    expect(plan.verdicts![0].required_m3).to.be.closeTo(2, 1e-12);
  });
  it('the demo budget: plausible months, storage short of 3 days only in the hot months', () => {
    const plan = planBudget(hillSmallholdingBudget, hillSmallholding);
    expect(plan.verdicts!.map((v) => v.status)).to.deep.equal([
      'enough',
      'enough',
      'enough',
      'enough',
      'enough',
      'storage-low',
      'storage-low',
      'storage-low',
      'enough',
      'enough',
      'enough',
      'enough',
    ]);
    expect(plan.warnings.filter((w) => /not an outlet/.test(w))).to.deep.equal([]);
  });
});

describe('water budget: bad input names the row and field', () => {
  const base = budget([]);
  const problems = (uses: unknown[], extra: Record<string, unknown> = {}) => validateBudget({ ...base, uses, ...extra });
  it('negative head counts, zero-area zones, months out of range, bad windows', () => {
    expect(problems([{ id: 'a', name: 'Cows', kind: 'livestock', count: -3, months: [1], outlets: [] }])).to.deep.equal([
      'uses[0] "Cows".count: must be a whole number ≥ 0 (got -3)',
    ]);
    expect(problems([{ id: 'a', name: 'Beds', kind: 'garden', area_m2: 0, months: [1], outlets: [] }])).to.deep.equal([
      'uses[0] "Beds".area_m2: must be a number > 0 (got 0)',
    ]);
    expect(problems([{ id: 'a', name: 'X', kind: 'other', daily_m3: 1, months: [0, 13], outlets: [] }])).to.deep.equal([
      'uses[0] "X".months[0]: must be a whole month 1–12 (got 0)',
      'uses[0] "X".months[1]: must be a whole month 1–12 (got 13)',
    ]);
    expect(problems([{ id: 'a', name: 'X', kind: 'other', daily_m3: 1, months: [1], outlets: [], window_h: 0 }])).to.deep.equal([
      'uses[0] "X".window_h: must be hours in (0, 24] (got 0)',
    ]);
    expect(problems([], { peak_sun_hours: [1, 2] })).to.deep.equal(['peak_sun_hours: must be a list of 12 numbers (January first)']);
    expect(problems([{ id: 'a', name: 'X', kind: 'livestock', rate_key: 'garden', count: 1, months: [1], outlets: [] }])[0]).to.match(
      /rate_key: row garden is for garden/,
    );
  });
  it('planBudget throws BudgetInputError carrying every problem', () => {
    expect(() => planBudget({ ...base, peak_factor: 0.5 })).to.throw(BudgetInputError, 'peak_factor: must be a number ≥ 1 (got 0.5)');
  });
});

describe('water budget: a house by its fixtures, a tunnel by its rows', () => {
  const GPM = GAL / 60;
  const PSI_M = 0.70307;
  it('fixture units read off the flush-tank demand table (IPC Appendix E Tables E103.3(2) and E103.3(3), M) and the fixture flows (IPC 2018 Table 604.3, V2)', () => {
    // one bathroom (tank toilet 2.2 + basin 0.7 + shower 1.4), kitchen sink 1.4, washer 1.4, hose bibb 2.5 = 9.6 fixture units (C)
    const house = fixturePeak({ 'toilet-tank': 1, lavatory: 1, shower: 1, 'kitchen-sink': 1, 'clothes-washer': 1, 'hose-bibb': 1 });
    expect(house.fixture_units).to.equal(9.6);
    // table: 9 → 13.7 gpm, 10 → 14.6 gpm; 9.6 → 13.7 + 0.6 × 0.9 = 14.24 gpm (C)
    expect(house.flow_m3s / GPM).to.be.closeTo(14.24, 1e-9);
    // the tank toilet asks 20 psi (Table 604.3, V2)
    expect(house.min_pressure_m / PSI_M).to.be.closeTo(20, 1e-9);
    expect(demandFromFixtureUnits(20) / GPM).to.be.closeTo(19.6, 1e-9);
    expect(demandFromFixtureUnits(101)).to.be.NaN;
    // a single basin is under one fixture unit: it draws its own 0.8 gpm (Table 604.3, V2)
    expect(fixturePeak({ lavatory: 1 }).flow_m3s / GPM).to.be.closeTo(0.8, 1e-12);
    // a second hose bibb adds 1.0, not 2.5 (Table E103.3(2) note, M)
    expect(fixturePeak({ 'hose-bibb': 2 }).fixture_units).to.equal(3.5);
  });
  it("a household by fixtures keeps its daily need per person and sets its outlet's flow to the peak", () => {
    const use: BudgetUse = {
      id: 'h',
      name: 'House',
      kind: 'household',
      rate_key: 'household',
      count: 3,
      months: ALL,
      outlets: ['HOUSE'],
      window_h: 6,
      fixtures: { 'toilet-tank': 1, lavatory: 1, shower: 1, 'kitchen-sink': 1, 'clothes-washer': 1, 'hose-bibb': 1 },
    };
    const plan = planBudget(budget([use]));
    // 3 people × 75 gal in July (defaults row, M) = 225 gal/day
    expect(plan.uses[0].peak_m3_day / GAL).to.be.closeTo(225, 1e-9);
    const out = plan.outlets[0];
    expect(out.design_flow_m3s / GPM).to.be.closeTo(14.24, 1e-9);
    expect(out.shares[0].rule).to.match(/9\.6 fixture units/);
    expect(out.shares[0].min_pressure_m! / PSI_M).to.be.closeTo(20, 1e-9);
    // without fixtures the same row delivers the day over its 6 h window
    const perPerson = planBudget(budget([{ ...use, fixtures: undefined }])).outlets[0];
    expect(perPerson.design_flow_m3s / GPM).to.be.closeTo(225 / 360, 1e-9);
  });
  it("a tunnel by rows: rows × length × emitter flow ÷ spacing, run hours a day (hand-worked, C; within Delaware State's 5–50 gal/day per 100 ft of row, V2)", () => {
    const FT = 0.3048;
    // 4 rows × 100 ft, emitters 1 gph every 12 in: 400 emitters = 400 gph = 6.667 gpm; 1 h a day (1.5 h in July) (C)
    const drip = { rows: 4, row_length_m: 100 * FT, emitter_spacing_m: FT, emitter_flow_m3s: GAL / 3600, run_h: 1, hot_run_h: 1.5 };
    const plan = planBudget(budget([{ id: 't', name: 'Tunnel', kind: 'tunnel', months: ALL, outlets: ['GH'], drip }]));
    expect(plan.uses[0].monthly_m3_day[0] / GAL).to.be.closeTo(400, 1e-9);
    expect(plan.uses[0].monthly_m3_day[6] / GAL).to.be.closeTo(600, 1e-9);
    expect(plan.outlets[0].design_flow_m3s / GPM).to.be.closeTo(400 / 60, 1e-9);
    // per 100 ft of row: 100 gal on a normal day, over Delaware's 5–50 range: this tunnel waters generously
    expect(plan.uses[0].monthly_m3_day[0] / GAL / 4).to.be.greaterThan(50);
    // drip tape at 0.45 gpm per 100 ft (a medium-flow tape, M), 1 h: 27 gal/day per 100 ft, inside 5–50 (V2)
    const tape = { rows: 4, row_length_m: 100 * FT, tape_flow_m3s_per_m: (0.45 * GPM) / (100 * FT), run_h: 1 };
    const taped = planBudget(budget([{ id: 't', name: 'Tunnel', kind: 'tunnel', months: ALL, outlets: ['GH'], drip: tape }]));
    expect(taped.uses[0].monthly_m3_day[0] / GAL / 4).to.be.closeTo(27, 1e-9);
    expect(taped.outlets[0].design_flow_m3s / GPM).to.be.closeTo(1.8, 1e-9);
  });
  it('bad fixtures and rows name the field', () => {
    const house: BudgetUse = { id: 'h', name: 'House', kind: 'household', count: 2, months: ALL, outlets: [], fixtures: { shower: -1 } };
    expect(validateBudget(budget([house]))).to.include('uses[0] "House".fixtures.shower: must be a whole number ≥ 0 (got -1)');
    expect(validateBudget(budget([{ ...house, fixtures: { sauna: 1 } as never }]))[0]).to.match(/fixtures\.sauna: no such fixture/);
    expect(validateBudget(budget([{ ...house, fixtures: { 'toilet-tank': 50 } }]))[0]).to.match(/110 fixture units is beyond this table \(100\)/);
    const tunnel: BudgetUse = {
      id: 't',
      name: 'Tunnel',
      kind: 'tunnel',
      months: ALL,
      outlets: [],
      drip: { rows: 0, row_length_m: 30, run_h: 1, tape_flow_m3s_per_m: 1e-6 },
    };
    expect(validateBudget(budget([tunnel]))).to.deep.equal(['uses[0] "Tunnel".drip.rows: must be a whole number ≥ 1 (got 0)']);
    expect(validateBudget(budget([{ ...tunnel, drip: { rows: 2, row_length_m: 30, run_h: 1 } }]))).to.deep.equal([
      'uses[0] "Tunnel".drip: give the emitter spacing and flow, or the tape flow per length',
    ]);
  });
});
