/**
 * The review checklist's rules, each at, just below and just above its limit, with the published
 * source beside it (marks as in REFERENCES.md: V read, V2 secondary, C computed, M memory).
 */
import { expect } from 'chai';
import type { NetworkDocument, PipeLink } from '../../engine';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { failingCheckCount, reviewChecklist } from '../../engine/review';
import { deliveryStatus, outletPressureStatus } from '../../engine/review/outlet-checks';
import { hglClearance, ratingStatus, surgeStatus, velocityStatus, workingShareStatus } from '../../engine/review/pipe-checks';
import { networkTurningPoints } from '../../engine/profile';
import { DROP_CAUTION_PRESSURE_M, HIGH_STATIC_PRESSURE_M } from '../../engine/review/rules';
import { fillStatus, refillStatus, storageStatus } from '../../engine/review/supply-checks';
import { hwLoss } from './hand-formulas';

const EPS = 1e-9;

/** A ridge tank feeding one outlet through one pipe: static head = 100 + 2 = 102 m. */
function line(pipe: Partial<PipeLink> = {}, outletElevation = 40, extra: Partial<NetworkDocument> = {}): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 2, level_m: 2, min_level_m: 0.2, max_level_m: 2 },
      { id: 'O', kind: 'outlet', elevation_m: outletElevation, demand_m3s: 0.0002, min_pressure_m: 10, outlet_type: 'hose-bib' },
    ],
    links: [{ id: 'P', kind: 'pipe', from: 'T', to: 'O', length_m: 100, diameter_m: 0.03, roughness: 150, ...pipe }],
    ...extra,
  };
}
const row = (doc: NetworkDocument, rule: string, element = 'P') => reviewChecklist(doc).rows.find((r) => r.rule === rule && r.element === element)!;

describe('review checks: outlets', () => {
  it('pressure: below the device requirement fails, at it and within 10 % is a caution, above 10 % passes (device figures: IPC 2018 Table 604.3, V2; 10 % margin common practice)', () => {
    expect(outletPressureStatus(10 - EPS, 10)).to.equal('fail');
    expect(outletPressureStatus(10, 10)).to.equal('caution');
    expect(outletPressureStatus(11 - EPS, 10)).to.equal('caution');
    expect(outletPressureStatus(11, 10)).to.equal('pass');
    expect(outletPressureStatus(Number.NaN, 10)).to.equal('fail');
  });

  it('pressure on a hand-built line: the row carries pressure, requirement and margin (60 m of fall less friction)', () => {
    const r = row(line(), 'outlet-pressure', 'O');
    expect(r.status).to.equal('pass');
    expect(r.limit!.value).to.equal(10);
    expect(r.margin!.value).to.be.closeTo(r.measured!.value - 10, 1e-12);
    // 62 m of fall (102 m water surface, outlet at 40 m) less the Hazen-Williams loss of 0.2 L/s in 100 m of 30 mm,
    // C 150, worked apart from the engine (hand-formulas.ts, C): 62 − 0.37 = 61.63 m
    expect(r.measured!.value).to.be.closeTo(62 - hwLoss(0.0002, 100, 0.03, 150), 1e-6);
    expect(r.measured!.value).to.be.closeTo(61.63, 0.01);
    const starved = line({}, 95);
    (starved.nodes[1] as { min_pressure_m: number }).min_pressure_m = 10;
    expect(row(starved, 'outlet-pressure', 'O').status).to.equal('fail');
  });

  it('delivery: at least 99 % of design passes, just under fails (Nebraska Stockwater Pipeline Handbook, USDA-NRCS 2008, V2; 99 % the engine tolerance)', () => {
    expect(deliveryStatus(0.99, 1)).to.equal('pass');
    expect(deliveryStatus(0.99 - EPS, 1)).to.equal('fail');
    expect(deliveryStatus(1.2, 1)).to.equal('pass');
  });

  it('static pressure at a house above 80 psi is a caution for a pressure reducer (IPC 604.8, M): just below, just above', () => {
    const house = (elev: number) => {
      const d = line({}, elev);
      (d.nodes[1] as { outlet_type: string }).outlet_type = 'house';
      return row(d, 'outlet-static-high', 'O');
    };
    // Static head 102 m: 80 psi = 56.25 m below it sits at 45.75 m.
    expect(HIGH_STATIC_PRESSURE_M).to.be.closeTo(56.25, 0.01);
    expect(house(102 - HIGH_STATIC_PRESSURE_M + 0.01).status).to.equal('pass');
    expect(house(102 - HIGH_STATIC_PRESSURE_M - 0.01).status).to.equal('caution');
  });
});

describe('review checks: pipes', () => {
  it('velocity ≤ 1.5 m/s (5 ft/s) passes, above is a caution (Jarrett, Water Management, 2nd ed., 2000, V2)', () => {
    expect(velocityStatus(1.5)).to.equal('pass');
    expect(velocityStatus(1.5 - EPS)).to.equal('pass');
    expect(velocityStatus(1.5 + EPS)).to.equal('caution');
    expect(velocityStatus(-1.6)).to.equal('caution');
    // 0.2 L/s in a 12 mm bore runs at 1.77 m/s (Q/A, C).
    expect(row(line({ diameter_m: 0.012 }), 'pipe-velocity').status).to.equal('caution');
    expect(row(line({ diameter_m: 0.012 }), 'pipe-velocity').measured!.value).to.be.closeTo(0.0002 / ((Math.PI / 4) * 0.012 ** 2), 1e-6);
  });

  it('working pressure against the rating: at it passes, above fails (NRCS Standard 430, V2)', () => {
    expect(ratingStatus(70, 70)).to.equal('pass');
    expect(ratingStatus(70 - EPS, 70)).to.equal('pass');
    expect(ratingStatus(70 + EPS, 70)).to.equal('fail');
    // Static 102 m at the outlet end (elevation 40) → 62 m: a 60 m pipe fails, a 65 m pipe passes.
    expect(row(line({ rating_m: 60 }), 'pipe-static-rating').status).to.equal('fail');
    expect(row(line({ rating_m: 65 }), 'pipe-static-rating').status).to.equal('pass');
    expect(row(line({ rating_m: 65 }), 'pipe-static-rating').measured!.value).to.be.closeTo(62, 1e-9);
  });

  it('working pressure ≤ 72 % of the rating passes, above is a caution (ASAE S376.1 via the Missouri Livestock Watering Systems Handbook, V2)', () => {
    expect(workingShareStatus(72, 100)).to.equal('pass');
    expect(workingShareStatus(72 - 1e-6, 100)).to.equal('pass');
    expect(workingShareStatus(72 + 1e-6, 100)).to.equal('caution');
    // 62 m working: 62/0.72 = 86.1 m is the smallest rating that passes.
    expect(row(line({ rating_m: 86.2 }), 'pipe-working-share').status).to.equal('pass');
    expect(row(line({ rating_m: 86.0 }), 'pipe-working-share').status).to.equal('caution');
  });

  it('a pipe with no rating is a caution saying so, never a silent pass', () => {
    const r = row(line(), 'pipe-static-rating');
    expect(r.status).to.equal('caution');
    expect(r.note).to.match(/No pressure rating/);
  });

  it('static plus surge at the rating passes, above fails (NRCS Standard 430, V2: pressure including transients below the rating)', () => {
    expect(surgeStatus(60, 40, 100)).to.equal('pass');
    expect(surgeStatus(60, 40 + 1e-6, 100)).to.equal('fail');
    expect(surgeStatus(60, 40 - 1e-6, 100)).to.equal('pass');
  });

  it('surge row on a hand-built PVC SDR 21 line: static + a·v/g with a from Korteweg (textbook, M)', () => {
    const doc = line({ series: 'pvc-sdr21', nominal: '1"', material: 'pvc', rating_m: 140.6, diameter_m: 0.0291 });
    const r = row(doc, 'pipe-surge');
    const a = r.detail!.find((d) => d.label === 'wave speed')!.amount.value;
    const surge = r.detail!.find((d) => d.label === 'surge head')!.amount.value;
    const v = Math.abs(reviewChecklist(doc).rows.find((x) => x.rule === 'pipe-velocity')!.measured!.value);
    expect(surge).to.be.closeTo((a * v) / 9.80665, 1e-9);
    expect(r.measured!.value).to.be.closeTo(62 + surge, 1e-9);
    expect(r.status).to.equal('pass');
    // The same line rated just under static + surge fails.
    expect(row({ ...doc, links: [{ ...(doc.links[0] as PipeLink), rating_m: 62 + surge - 0.01 }] }, 'pipe-surge').status).to.equal('fail');
  });

  it('HGL against the pipe along its ground profile: clearance 0 passes, a hump above the HGL fails (NRCS Washington ETN 16, V2)', () => {
    const pipe = { id: 'P', kind: 'pipe', from: 'A', to: 'B', length_m: 100, diameter_m: 0.03, roughness: 150, cover_m: 0.5 } as PipeLink;
    // HGL from 50 to 40 m: at 50 m along it stands at 45 m; ground 45.5 less 0.5 cover touches it.
    expect(
      hglClearance(
        {
          ...pipe,
          profile: [
            [0, 30],
            [50, 45.5],
            [100, 30],
          ],
        },
        50,
        40,
        30,
        30,
      ).clearance_m,
    ).to.be.closeTo(0, 1e-12);
    expect(
      hglClearance(
        {
          ...pipe,
          profile: [
            [0, 30],
            [50, 45.6],
            [100, 30],
          ],
        },
        50,
        40,
        30,
        30,
      ).clearance_m,
    ).to.be.closeTo(-0.1, 1e-9);
    expect(
      hglClearance(
        {
          ...pipe,
          profile: [
            [0, 30],
            [50, 45.4],
            [100, 30],
          ],
        },
        50,
        40,
        30,
        30,
      ).at_m,
    ).to.equal(50);
    // On a network: a hump 5 m above the tank's water surface fails.
    const hump = line({
      profile: [
        [0, 100],
        [50, 107.5],
        [100, 40],
      ],
    });
    expect(row(hump, 'pipe-hgl').status).to.equal('fail');
    expect(row(hump, 'pipe-hgl').at_m).to.equal(50);
    expect(
      row(
        line({
          profile: [
            [0, 100],
            [50, 80],
            [100, 40],
          ],
        }),
        'pipe-hgl',
      ).status,
    ).to.equal('pass');
  });
});

describe('review checks: profile (NRCS Washington ETN 16 and NRCS Missouri, V2)', () => {
  // The points come from engine/profile (the Profile screen's turning points); the 0.3 m relief filter is ours.
  it('finds high and low points with a rise of 0.3 m or more; a ripple just under it is survey noise', () => {
    const pts = (mid: number) =>
      networkTurningPoints(
        line({
          cover_m: 0,
          profile: [
            [0, 100],
            [30, 90],
            [60, mid],
            [100, 40],
          ],
        }),
      ).map((p) => [p.kind, p.link, p.along_m, p.elevation_m]);
    expect(pts(90.31)).to.deep.equal([
      ['low-point', 'P', 30, 90],
      ['high-point', 'P', 60, 90.31],
    ]);
    expect(pts(90.29)).to.deep.equal([]);
  });

  it('finds points at tees between pipes, on a pipe drawn against the flow (placed from its own from end) and on a rising main', () => {
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'S', kind: 'source', elevation_m: 10, head_m: 10 },
        { id: 'J0', kind: 'tee', elevation_m: 10, demand_m3s: 0 },
        { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 2, level_m: 2, min_level_m: 0.2, max_level_m: 2 },
        { id: 'J1', kind: 'tee', elevation_m: 60, demand_m3s: 0, drain: true },
        { id: 'J2', kind: 'tee', elevation_m: 70, demand_m3s: 0 },
        { id: 'O', kind: 'outlet', elevation_m: 40, demand_m3s: 0.0002, min_pressure_m: 10 },
      ],
      links: [
        { id: 'PU', kind: 'pump', from: 'S', to: 'J0', flow_m3s: 0.0005 },
        {
          id: 'R',
          kind: 'pipe',
          from: 'J0',
          to: 'T',
          length_m: 300,
          diameter_m: 0.03,
          roughness: 150,
          cover_m: 0,
          profile: [
            [0, 10],
            [100, 50],
            [200, 45],
            [300, 100],
          ],
        },
        { id: 'P1', kind: 'pipe', from: 'T', to: 'J1', length_m: 100, diameter_m: 0.03, roughness: 150 },
        { id: 'P2', kind: 'pipe', from: 'J1', to: 'J2', length_m: 100, diameter_m: 0.03, roughness: 150 },
        // Drawn from the outlet up to J2: its hump lies 20 m from O, 80 m along the route.
        {
          id: 'P3',
          kind: 'pipe',
          from: 'O',
          to: 'J2',
          length_m: 100,
          diameter_m: 0.03,
          roughness: 150,
          cover_m: 0,
          profile: [
            [0, 40],
            [20, 66],
            [50, 50],
            [100, 70],
          ],
        },
      ],
    } as NetworkDocument;
    const got = networkTurningPoints(doc).map((p) => [p.kind, p.node ?? p.link, p.node ? null : p.along_m, p.fitted]);
    expect(got).to.have.deep.members([
      ['low-point', 'J1', null, true],
      ['high-point', 'J2', null, false],
      ['low-point', 'P3', 50, false],
      ['high-point', 'P3', 20, false],
      ['high-point', 'R', 100, false],
      ['low-point', 'R', 200, false],
    ]);
    expect(got).to.have.length(6);
  });

  it('a high point is a caution without an air valve and passes with one within 10 m; a drain serves a low point', () => {
    const humpy = line({
      profile: [
        [0, 100],
        [30, 90],
        [60, 95],
        [100, 40],
      ],
    });
    const rows = reviewChecklist(humpy).rows.filter((r) => r.group === 'profile');
    expect(rows.map((r) => [r.rule, r.at_m, r.status])).to.deep.equal([
      ['profile-low-point', 30, 'caution'],
      ['profile-high-point', 60, 'caution'],
    ]);
    const fitted = line({
      profile: [
        [0, 100],
        [30, 90],
        [60, 95],
        [100, 40],
      ],
      air_valves_m: [70],
      drains_m: [41],
    } as Partial<PipeLink>);
    const after = reviewChecklist(fitted).rows.filter((r) => r.group === 'profile');
    expect(after.map((r) => [r.rule, r.status])).to.deep.equal([
      ['profile-low-point', 'caution'],
      ['profile-high-point', 'pass'],
    ]);
  });
});

describe('review checks: storage and supply', () => {
  it('storage ≥ 3 days passes for a solar fill, under fails (NRCS South Dakota SD2006-1, NRCS Kansas, V2)', () => {
    expect(storageStatus(3)).to.equal('pass');
    expect(storageStatus(3 - EPS)).to.equal('fail');
    expect(storageStatus(3 + EPS)).to.equal('pass');
  });

  it('fill daily volume: under the need fails, under need + 10 % is a caution (Nebraska Stockwater Pipeline Handbook, V2)', () => {
    expect(fillStatus(99.99, 100)).to.equal('fail');
    expect(fillStatus(100, 100)).to.equal('caution');
    expect(fillStatus(110 - 1e-6, 100)).to.equal('caution');
    expect(fillStatus(110, 100)).to.equal('pass');
  });

  it('trough refill: the daily need delivered within 4 h passes (Ohio State ANR-12 after Gerrish & Davis, V2)', () => {
    // 0.1 L/s for 4 h = 1.44 m³.
    expect(refillStatus(0.0001, 1.44)).to.equal('pass');
    expect(refillStatus(0.0001, 1.44 + 1e-6)).to.equal('fail');
    expect(refillStatus(0.0001, 1.44 - 1e-6)).to.equal('pass');
  });

  it('on a solar-filled tank: storage days are usable volume ÷ daily need; budget figures replace the flow estimate', () => {
    const doc = line({}, 40, {
      links: [
        { id: 'P', kind: 'pipe', from: 'T', to: 'O', length_m: 100, diameter_m: 0.03, roughness: 150 },
        { id: 'PU', kind: 'pump', from: 'W', to: 'T', flow_m3s: 0.0005, schedule: [...Array(8).fill(0), ...Array(8).fill(1), ...Array(8).fill(0)] },
      ],
    });
    doc.nodes.push({ id: 'W', kind: 'source', elevation_m: 50, head_m: 50 });
    // Usable π/4·2²·1.8 = 5.655 m³ (C); need 0.2 L/s all day = 17.28 m³ → 0.327 days.
    const storage = reviewChecklist(doc).rows.find((r) => r.rule === 'storage-days')!;
    expect(storage.measured!.value).to.be.closeTo((Math.PI * 1.8) / 17.28, 1e-9);
    expect(storage.status).to.equal('fail');
    const withBudget = reviewChecklist(doc, { supply: { worstDailyNeed_m3: 1.885, fillDailyVolume_m3: 14.4 } });
    expect(withBudget.rows.find((r) => r.rule === 'storage-days')!.measured!.value).to.be.closeTo((Math.PI * 1.8) / 1.885, 1e-9);
    // Pump 0.5 L/s × 8 h = 14.4 m³ ≥ 17.28 × 1.1? No: fails on flows, passes against the budget's 1.885 m³.
    expect(reviewChecklist(doc).rows.find((r) => r.rule === 'fill-daily-volume')!.status).to.equal('fail');
    expect(withBudget.rows.find((r) => r.rule === 'fill-daily-volume')!.status).to.equal('pass');
  });
});

describe('review checklist: the demo farm', () => {
  const list = reviewChecklist(hillSmallholding);

  it('solves and covers every outlet and pipe, with a rule and source on every row and unique keys', () => {
    expect(list.solved).to.equal(true);
    const outlets = hillSmallholding.nodes.filter((n) => n.kind === 'outlet').map((n) => n.id);
    const pipes = hillSmallholding.links.filter((l) => l.kind === 'pipe').map((l) => l.id);
    for (const id of outlets)
      expect(
        list.rows.some((r) => r.rule === 'outlet-pressure' && r.element === id),
        id,
      ).to.equal(true);
    for (const id of pipes) expect(list.rows.filter((r) => r.group === 'pipes' && r.element === id).length, id).to.be.at.least(4);
    for (const r of list.rows) expect(r.source.length, r.key).to.be.greaterThan(10);
    expect(new Set(list.rows.map((r) => r.key)).size).to.equal(list.rows.length);
  });

  it('shows the cautions it was designed to show: the dip line near its rating, its high point without an air valve, the house above 80 psi', () => {
    const find = (rule: string, el: string) => list.rows.find((r) => r.rule === rule && r.element === el)!;
    expect(find('pipe-working-share', 'L-TR4').status).to.equal('caution');
    expect(find('pipe-static-rating', 'L-TR4').status).to.equal('pass');
    expect(find('profile-high-point', 'L-TR4').status).to.equal('caution');
    expect(find('profile-high-point', 'L-TR4').at_m).to.equal(240);
    expect(find('outlet-static-high', 'HOUSE').status).to.equal('caution');
    expect(list.rows.find((r) => r.rule === 'safety-drop-pressure')!.element).to.equal('L-TR4');
    expect(DROP_CAUTION_PRESSURE_M).to.be.closeTo(35.15, 0.01);
  });

  it('failingCheckCount is the number of failing rows (the Options column)', () => {
    expect(failingCheckCount(hillSmallholding)).to.equal(list.counts.fail);
    // by hand: a 60 m rating under 62 m of static head fails the rating, and static + a·v/g fails the surge check;
    // the working share (62/60 > 72 %) is a caution, velocity 0.28 m/s and 61.6 m at the outlet pass
    const failing = reviewChecklist(line({ rating_m: 60 })).rows.filter((r) => r.status === 'fail');
    expect(failing.map((r) => r.rule)).to.deep.equal(['pipe-static-rating', 'pipe-surge']);
    expect(failingCheckCount(line({ rating_m: 60 }))).to.equal(2);
  });
});

describe('review checklist with the water budget (engine/budget)', () => {
  it("takes the worst month for the fill, the peak month for storage, and each trough's herd need for refill", async () => {
    const { planBudget, applyBudget } = await import('../../engine/budget');
    const { hillSmallholdingBudget } = await import('../../engine/examples/hill-smallholding-budget');
    const { supplyFromBudget } = await import('../../engine/review');
    const plan = planBudget(hillSmallholdingBudget, hillSmallholding);
    const doc = applyBudget(hillSmallholding, plan);
    const supply = supplyFromBudget(plan, doc);
    const verdicts = plan.verdicts!.filter((v) => v.daily_need_m3 > 0);
    const worst = verdicts.reduce((a, b) => (b.balance_m3 < a.balance_m3 ? b : a));
    expect(supply.worstDailyNeed_m3).to.equal(worst.daily_need_m3);
    expect(supply.fillDailyVolume_m3).to.equal(worst.daily_fill_m3);
    expect(supply.peakDailyNeed_m3).to.equal(Math.max(...verdicts.map((v) => v.daily_need_m3)));
    const rows = reviewChecklist(doc, { supply }).rows;
    const fill = rows.find((r) => r.rule === 'fill-daily-volume')!;
    expect(fill.measured!.value).to.equal(worst.daily_fill_m3);
    expect(fill.note).to.match(new RegExp(supply.worstMonth!));
    const tr1 = rows.find((r) => r.rule === 'trough-refill' && r.element === 'TR1')!;
    expect(tr1.measured!.quantity).to.equal('hours');
    // Hours to deliver the herd's daily need at the delivered flow (C).
    const delivered = doc.nodes.find((n) => n.id === 'TR1') as { demand_m3s: number };
    expect(tr1.measured!.value).to.be.closeTo(supply.troughDailyNeed_m3!.TR1 / delivered.demand_m3s / 3600, 0.01 * tr1.measured!.value);
  });
});
