import { expect } from 'chai';
import { GRAVITY_MS2 } from '../../engine/constants';
import type { NetworkDocument } from '../../engine/network-document';
import { simulate } from '../../engine/simulate';

const AREA = 4; // m²
const TANK_D = Math.sqrt((4 * AREA) / Math.PI);
const DAYLIGHT = Array.from({ length: 24 }, (_, h) => (h >= 8 && h < 16 ? 1 : 0)); // 08:00–16:00

/** Well → solar pump (0.5 L/s by daylight) → 4 m² tank 50 m up → trough drawing 0.1 L/s all day. */
function fillDraw(overrides: { pump?: boolean; level?: number; inflow?: number; demand?: number } = {}): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'S', kind: 'source', elevation_m: 0, head_m: 0 },
      {
        id: 'T',
        kind: 'tank',
        elevation_m: 50,
        diameter_m: TANK_D,
        level_m: overrides.level ?? 1.2,
        min_level_m: 0.1,
        max_level_m: 2,
        inflow_m3s: overrides.inflow,
      },
      { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: overrides.demand ?? 0.0001, min_pressure_m: 10 },
    ],
    links: [
      ...(overrides.pump === false
        ? []
        : [
            {
              id: 'PU',
              kind: 'pump' as const,
              from: 'S',
              to: 'T',
              flow_m3s: 0.0005,
              schedule: DAYLIGHT,
              control: { tank: 'T', stop_level_m: 1.5, start_level_m: 1.3 },
            },
          ]),
      { id: 'P', kind: 'pipe', from: 'T', to: 'O', length_m: 100, diameter_m: 0.05, roughness: 150 },
    ],
  };
}

describe('extended-period simulation (simulate.ts)', () => {
  /*
   * Hand computation (rates: pump 0.5 L/s − draw 0.1 L/s = +0.36 m/h on 4 m²; draw alone −0.09 m/h):
   * 00:00–08:00 pump off (dark): 1.20 → 0.48 m (lowest level, at 08:00)
   * 08:00 on; reaches the 1.50 m stop after 1.02/0.36 = 2.8333 h (10:50)
   * off; falls to the 1.30 m restart after 0.2/0.09 = 2.2222 h (13:03:20)
   * on; 0.5556 h to 1.50 (13:36:40); off; 2.2222 h to 1.30 (15:50); on until dark at 16:00: +0.06 → 1.36
   * 16:00–24:00 off: 1.36 − 0.72 = 0.64 m
   * pumped 0.5 L/s × (2.8333 + 0.5556 + 0.1667) h = 6.4 m³; delivered 0.1 L/s × 24 h = 8.64 m³
   */
  it('a fill-draw day with a daylight schedule and stop/restart control reproduces the hand-computed volumes', () => {
    const day = simulate(fillDraw(), { duration_s: 86400, step_s: 600 });
    expect(day.warnings).to.deep.equal([]);
    expect(day.summary.pumps['PU'].pumped_m3).to.be.closeTo(6.4, 1e-6);
    expect(day.summary.outlets['O'].delivered_m3).to.be.closeTo(8.64, 1e-6);
    expect(day.summary.outlets['O'].unmet_m3).to.be.closeTo(0, 1e-9);
    expect(day.tanks['T'].level_m.at(-1)).to.be.closeTo(0.64, 1e-6);
    expect(day.summary.tanks['T'].lowest_level_m).to.be.closeTo(0.48, 1e-6);
    expect(day.summary.tanks['T'].lowest_time_s).to.be.closeTo(8 * 3600, 1e-6);
    // volume balance: storage change = pumped − delivered
    expect(((day.tanks['T'].level_m.at(-1) as number) - 1.2) * AREA).to.be.closeTo(6.4 - 8.64, 1e-6);
    const at = (hhmm: number): number => day.times_s.indexOf(hhmm);
    expect(day.pumps['PU'].on[at(9 * 3600)]).to.equal(true);
    expect(day.pumps['PU'].on[at(12 * 3600)]).to.equal(false); // stopped at 1.50 m, waiting for 1.30 m
    expect(day.pumps['PU'].on[at(20 * 3600)]).to.equal(false); // dark
    expect(day.tanks['T'].level_m[at(11 * 3600)]).to.be.closeTo(1.5 - 0.09 * (1 / 6), 1e-6); // stopped at 10:50
    expect(day.times_s.length).to.equal(145);
  });

  it('an empty tank stops supplying: the trough starves and the shortfall is counted as unmet', () => {
    // no pump: 1.2 → 0.1 m at 0.09 m/h takes 12.222 h; delivered 1.1 m × 4 m² = 4.4 m³ of 8.64 m³
    const day = simulate(fillDraw({ pump: false }), { duration_s: 86400, step_s: 600 });
    expect(day.summary.outlets['O'].delivered_m3).to.be.closeTo(4.4, 1e-6);
    expect(day.summary.outlets['O'].unmet_m3).to.be.closeTo(8.64 - 4.4, 1e-6);
    expect(day.summary.tanks['T'].lowest_level_m).to.equal(0.1);
    expect(Math.min(...day.tanks['T'].level_m)).to.equal(0.1);
    expect(day.warnings.map((w) => w.code)).to.have.members(['tank-empty', 'unmet-demand']);
    expect(day.warnings.find((w) => w.code === 'tank-empty')?.message).to.equal('T: ran empty at 12:13');
  });

  it('a full tank overflows its surplus (steady inflow 0.2 L/s, no draw)', () => {
    // 1.9 → 2.0 m takes 0.4 m³ / 0.2 L/s = 2000 s; the remaining 1600 s of the hour spill 0.32 m³
    const hour = simulate(fillDraw({ pump: false, level: 1.9, inflow: 0.0002, demand: 0 }), { duration_s: 3600, step_s: 300 });
    expect(hour.summary.tanks['T'].overflow_m3).to.be.closeTo(0.32, 1e-8);
    expect(hour.tanks['T'].level_m.at(-1)).to.equal(2);
    expect(hour.warnings.map((w) => w.code)).to.deep.equal(['tank-overflow']);
  });

  it('Torricelli draining through an orifice follows h(t) = (√H − (a/A)·√(g/2)·t)² (university physics texts, V)', () => {
    // 1 m² tank, 0.001 m² orifice with Cd = 1 (K = 1/Cd² = 1) discharging at the tank floor
    const a = 0.001;
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T', kind: 'tank', elevation_m: 10, diameter_m: Math.sqrt(4 / Math.PI), level_m: 2, min_level_m: 0.05, max_level_m: 3 },
        { id: 'OUT', kind: 'source', elevation_m: 10, head_m: 10 },
      ],
      links: [{ id: 'OR', kind: 'valve', valve_type: 'shutoff', from: 'T', to: 'OUT', diameter_m: Math.sqrt((4 * a) / Math.PI), minor_loss: 1 }],
    };
    const run = simulate(doc, { duration_s: 500, step_s: 1 });
    const c = a * Math.sqrt(GRAVITY_MS2 / 2); // per unit area
    for (const t of [100, 250, 400, 500]) {
      const exact = (Math.sqrt(2) - c * t) ** 2;
      // backward Euler with 1 s steps: first-order error, a few millimetres at most over 500 s
      expect(run.tanks['T'].level_m[t], `t = ${t} s`).to.be.closeTo(exact, 3e-3);
    }
    // total drain time to 0.05 m by the closed form: (√2 − √0.05)/c = 535.6 s
    const emptyAt = (Math.sqrt(2) - Math.sqrt(0.05)) / c;
    const longer = simulate(doc, { duration_s: 600, step_s: 1 });
    const firstMin = longer.tanks['T'].level_m.findIndex((l) => l <= 0.05 + 1e-12);
    expect(Math.abs(longer.times_s[firstMin] - emptyAt)).to.be.below(3);
  });

  it('reports progress: rising fractions of the duration, about a hundred at most, ending at 1', () => {
    const seen: number[] = [];
    const run = simulate(fillDraw(), { duration_s: 2 * 86400, step_s: 60, onProgress: (f) => seen.push(f) });
    expect(run.times_s.length).to.equal(2 * 1440 + 1);
    expect(seen.length).to.be.within(20, 101);
    expect(seen[seen.length - 1]).to.equal(1);
    for (let i = 1; i < seen.length; i++) expect(seen[i], `call ${i}`).to.be.above(seen[i - 1]);
    expect(seen[0]).to.be.within(0.01, 0.05); // steps end at least every hour (1/48 of the run)
    const none: number[] = [];
    simulate(fillDraw(), { duration_s: 0, step_s: 60, onProgress: (f) => none.push(f) });
    expect(none).to.deep.equal([1]);
  });
});
