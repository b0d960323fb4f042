import { expect } from 'chai';
import { GRAVITY_MS2 } from '../../engine/constants';
import type { NetworkDocument } from '../../engine/network-document';
import { simulate } from '../../engine/simulate';

/**
 * Extended-period levels against references computed here, independently of the engine, at report
 * steps of 10, 60 and 600 s (issue 14 item 5: levels to 1 mm whatever the report step):
 * - two unequal tanks equalising through a pipe: the level ODE A·dh/dt = ∓Q with Hazen-Williams
 *   Q = (Δh/r)^(1/1.852), r = 10.67·L/(C^1.852·D^4.8704) (REFERENCES.md, V), integrated by the
 *   Dormand–Prince RK5(4) pair with error control (Dormand, J.R. & Prince, P.J. (1980), "A family of
 *   embedded Runge-Kutta formulae", J. Comp. Appl. Math. 6(1), 19–26), written out below;
 * - Torricelli draining through an orifice, h(t) = (√H − (a/A)·√(g/2)·t)² (REFERENCES.md, V);
 * - an empty tank refilled by a trickle, supplying again 1 cm up (engine/README.md, scenario 8):
 *   a saw-tooth whose phases follow from the volumes alone (C, hand computation in the test).
 */

type Rhs = (t: number, y: number[]) => number[];
const A = [
  [],
  [1 / 5],
  [3 / 40, 9 / 40],
  [44 / 45, -56 / 15, 32 / 9],
  [19372 / 6561, -25360 / 2187, 64448 / 6561, -212 / 729],
  [9017 / 3168, -355 / 33, 46732 / 5247, 49 / 176, -5103 / 18656],
  [35 / 384, 0, 500 / 1113, 125 / 192, -2187 / 6784, 11 / 84],
];
const C = [0, 1 / 5, 3 / 10, 4 / 5, 8 / 9, 1, 1];
const B4 = [5179 / 57600, 0, 7571 / 16695, 393 / 640, -92097 / 339200, 187 / 2100, 1 / 40];

/** Dormand–Prince RK5(4) from t0 to t1 (local extrapolation, step control on the embedded 4th-order error). */
function dopri(f: Rhs, y0: number[], t0: number, t1: number, tol = 1e-11): number[] {
  let y = y0.slice();
  let t = t0;
  let h = Math.min(1, t1 - t0);
  while (t < t1 - 1e-12) {
    if (t + h > t1) h = t1 - t;
    const k: number[][] = [];
    for (let s = 0; s < 7; s++) {
      const ys = y.map((v, i) => v + h * A[s].reduce((acc, a, j) => acc + a * k[j][i], 0));
      k.push(f(t + C[s] * h, ys));
    }
    const y5 = y.map((v, i) => v + h * A[6].reduce((acc, a, j) => acc + a * k[j][i], 0));
    const y4 = y.map((v, i) => v + h * B4.reduce((acc, b, j) => acc + b * k[j][i], 0));
    const err = Math.max(...y5.map((v, i) => Math.abs(v - y4[i])));
    if (err <= tol) {
      t += h;
      y = y5;
    }
    h *= Math.min(4, Math.max(0.1, 0.9 * Math.pow(tol / Math.max(err, 1e-300), 0.2)));
  }
  return y;
}

const tankDiameter = (area: number): number => Math.sqrt((4 * area) / Math.PI);

describe('extended period: levels with error control, whatever the report step (issue 14 item 5)', () => {
  // two tanks on one pad: 2 m² at 1.8 m and 6 m² at 0.3 m, joined by 50 m of 50 mm pipe (C 140)
  const A1 = 2;
  const A2 = 6;
  const bank: NetworkDocument = {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T1', kind: 'tank', elevation_m: 20, diameter_m: tankDiameter(A1), level_m: 1.8, min_level_m: 0.05, max_level_m: 2 },
      { id: 'T2', kind: 'tank', elevation_m: 20, diameter_m: tankDiameter(A2), level_m: 0.3, min_level_m: 0.05, max_level_m: 2 },
    ],
    links: [{ id: 'H', kind: 'pipe', from: 'T1', to: 'T2', length_m: 50, diameter_m: 0.05, roughness: 140 }],
  };
  const r = (10.67 * 50) / (Math.pow(140, 1.852) * Math.pow(0.05, 4.8704));
  const rhs: Rhs = (_t, [h1, h2]) => {
    const d = h1 - h2;
    const q = Math.sign(d) * Math.pow(Math.abs(d) / r, 1 / 1.852);
    return [-q / A1, q / A2];
  };

  for (const step of [10, 60, 600]) {
    it(`two unequal tanks equalising match a Dormand–Prince solution to 1 mm at ${step} s report steps`, () => {
      const run = simulate(bank, { duration_s: 1800, step_s: step });
      let y = [1.8, 0.3];
      let worst = 0;
      run.times_s.forEach((t, j) => {
        if (j > 0) y = dopri(rhs, y, run.times_s[j - 1], t);
        worst = Math.max(worst, Math.abs(run.tanks['T1'].level_m[j] - y[0]), Math.abs(run.tanks['T2'].level_m[j] - y[1]));
      });
      expect(worst).to.be.below(1e-3);
      // the exchange is under way at the first report and near its end by the last, heading for
      // the common level (2·1.8 + 6·0.3)/8 = 0.675 m (so the comparison covers the whole curve)
      expect(run.tanks['T1'].level_m[1]).to.be.below(1.8 - 0.01);
      expect(run.tanks['T1'].level_m.at(-1)).to.be.within(0.675, 0.75);
    });
  }

  for (const step of [10, 60, 600]) {
    it(`Torricelli draining: levels to 1 mm and the moment the tank runs empty to 0.1 s at ${step} s report steps`, () => {
      const a = 0.001;
      const doc: NetworkDocument = {
        schema: 'runnel.network/1',
        headloss: 'hazen-williams',
        nodes: [
          { id: 'T', kind: 'tank', elevation_m: 10, diameter_m: tankDiameter(1), level_m: 2, min_level_m: 0.05, max_level_m: 3 },
          { id: 'OUT', kind: 'source', elevation_m: 10, head_m: 10 },
        ],
        links: [{ id: 'OR', kind: 'valve', valve_type: 'shutoff', from: 'T', to: 'OUT', diameter_m: tankDiameter(a), minor_loss: 1 }],
      };
      const run = simulate(doc, { duration_s: 1200, step_s: step });
      const c = a * Math.sqrt(GRAVITY_MS2 / 2);
      const emptyAt = (Math.sqrt(2) - Math.sqrt(0.05)) / c; // 535.6 s
      run.times_s.forEach((t, j) => {
        const exact = t < emptyAt ? (Math.sqrt(2) - c * t) ** 2 : 0.05;
        expect(run.tanks['T'].level_m[j], `t = ${t} s`).to.be.closeTo(exact, 1e-3);
      });
      // the event is located where the computed level reaches the minimum; that level is within the
      // step tolerance (1e-4 m) of the true one, which at the last rate (1e-3 m/s) is 0.1 s
      expect(run.summary.tanks['T'].lowest_time_s).to.be.closeTo(emptyAt, 0.1);
    });
  }

  it('an empty tank refilled by a trickle supplies again exactly 1 cm up: 3-day volumes do not depend on the report step', () => {
    // 4 m² tank, trickle 0.1 L/s in, trough draws 0.3 L/s when supplied. Empty: +1 cm takes
    // 0.04 m³ / 0.1 L/s = 400 s; supplying: −1 cm takes 0.04 m³ / 0.2 L/s = 200 s. 432 such
    // 600 s cycles in 3 days: delivered 0.3 L/s × 200 s × 432 = 25.92 m³ of 77.76 m³ requested.
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T', kind: 'tank', elevation_m: 50, diameter_m: tankDiameter(4), level_m: 0.1, min_level_m: 0.1, max_level_m: 2, inflow_m3s: 0.0001 },
        { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0003 },
      ],
      links: [{ id: 'P', kind: 'pipe', from: 'T', to: 'O', length_m: 100, diameter_m: 0.05, roughness: 140 }],
    };
    for (const step of [60, 600, 3600]) {
      const run = simulate(doc, { duration_s: 3 * 86400, step_s: step });
      expect(run.summary.outlets['O'].delivered_m3, `${step} s`).to.be.closeTo(25.92, 1e-6);
      expect(run.summary.outlets['O'].unmet_m3, `${step} s`).to.be.closeTo(77.76 - 25.92, 1e-6);
      run.times_s.forEach((t, j) => {
        const phase = t % 600;
        const exact = phase <= 400 ? 0.1 + 0.01 * (phase / 400) : 0.11 - 0.01 * ((phase - 400) / 200);
        expect(run.tanks['T'].level_m[j], `${step} s report, t = ${t} s`).to.be.closeTo(exact, 1e-6);
      });
    }
  });
});
