import { expect } from 'chai';
import fc from 'fast-check';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { demoPriceCatalogue } from '../../engine/examples/demo-prices';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { TWO_LOOP_COST_PER_M, twoLoop, twoLoopPrices } from '../../engine/examples/two-loop';
import type { NetworkDocument, PipeLink } from '../../engine/network-document';
import { catalogueCandidate, parsePriceCatalogue, type SizingCandidate } from '../../engine/sizing/price-catalogue';
import { pipeStaticPressures } from '../../engine/sizing/verify';
import { pipeWaveSpeed } from '../../engine/review/wave-speed';
import { partitionNetwork } from '../../engine/sizing/regions';
import { sizeNetwork } from '../../engine/sizing/size-network';
import { solve } from '../../engine/steady';
import { reviewChecklist } from '../../engine/review';
import { pipeSizes } from '../../engine/pipe-catalogue';

const demoCandidates = parsePriceCatalogue(demoPriceCatalogue()).candidates;
const twoLoopCandidates = parsePriceCatalogue(twoLoopPrices).candidates;

describe('pipe sizing (engine/sizing)', () => {
  it('reads a priced catalogue and names the item and field that is wrong', () => {
    expect(twoLoopCandidates).to.have.length(14);
    const bad = parsePriceCatalogue({
      items: [
        { series: 'pvc-sch40', nominal: '1"', price_per_m: 2 },
        { series: 'pvc-sch40', nominal: '1"', price_per_m: -1 },
        { id: 'X', price_per_m: 3 },
      ],
    });
    expect(bad.errors).to.deep.equal([
      'items[1].price_per_m: must be a non-negative number (got -1)',
      'items[2].diameter_m: must be a positive number (got undefined)',
    ]);
    expect(parsePriceCatalogue({ items: [] }).errors).to.deep.equal(['items: the catalogue has no priced pipe']);
    expect(parsePriceCatalogue('x').errors).to.have.length(1);
  });

  it('partitions the demo: one tree behind the tank bank, the rising main on the pump side, the header outside', () => {
    const p = partitionNetwork(hillSmallholding);
    expect(p.regions.map((r) => r.kind).sort()).to.deep.equal(['pump', 'tree']);
    expect(p.regions.find((r) => r.kind === 'tree')?.root).to.deep.equal({ node: 'T2', link: 'V0' });
    expect(p.outside.map((o) => o.link)).to.deep.equal(['HD1']);
    expect(partitionNetwork(twoLoop()).regions.map((r) => r.kind)).to.deep.equal(['looped']);
  });

  it('two-loop network (Alperovits & Shamir 1977, REFERENCES.md): $419,000 or less with every head ≥ 30 m at ω = 10.667', function () {
    this.timeout(60000);
    // ω = 10.667 is the value the widely quoted pressures of the published design match (REFERENCES.md, C/M)
    const r = sizeNetwork(twoLoop(), twoLoopCandidates, { minPressure_m: 30, omega: 10.667, velocityLimit_ms: 1e9 });
    expect(r.feasible).to.equal(true);
    expect(r.regions[0].method).to.equal('heuristic local search');
    expect(r.cost).to.be.at.most(419000);
    // cost re-derived from the published table, typed here from REFERENCES.md (Alperovits & Shamir 1977, V),
    // and pressures from an independent solve; the program's own table must agree with the published one
    const published: Record<number, number> = { 1: 2, 2: 5, 3: 8, 4: 11, 6: 16, 8: 23, 10: 32, 12: 50, 14: 60, 16: 90, 18: 130, 20: 170, 22: 300, 24: 550 };
    expect(TWO_LOOP_COST_PER_M).to.deep.equal(published);
    const inches = r.document.links.map((l) => Math.round((l as PipeLink).diameter_m / 0.0254));
    expect(inches.reduce((s, d) => s + published[d] * 1000, 0)).to.equal(r.cost);
    const check = solve(r.document, { omega: 10.667 });
    for (const id of ['2', '3', '4', '5', '6', '7']) expect(check.nodes[id].pressure_m, `node ${id}`).to.be.at.least(30 - 1e-3);
  });

  it('the demo farm sizes exactly (tree) to less than its largest-size design, with every outlet passing', () => {
    const r = sizeNetwork(hillSmallholding, demoCandidates, {});
    expect(r.feasible).to.equal(true);
    expect(r.regions.find((g) => g.kind === 'tree')?.exact).to.equal(true);
    expect(r.cost).to.be.below(r.largestCost);
    expect(r.skipped.map((s) => s.pipe).sort()).to.deep.equal(['HD1', 'R1']);
    const solved = solve(r.document);
    for (const node of r.document.nodes) {
      if (node.kind !== 'outlet') continue;
      expect(solved.nodes[node.id].pressure_m, node.id).to.be.at.least((node.min_pressure_m ?? 0) - 1e-3);
    }
    expect(solved.warnings.filter((w) => ['velocity-high', 'over-rating', 'below-minimum', 'negative-pressure'].includes(w.code))).to.deep.equal([]);
    // the largest-size design: every sized pipe at the largest size of its own series, priced from the same list
    const prices = new Map(demoPriceCatalogue().items.map((i) => [`${i.series}/${i.nominal}`, i.price_per_m]));
    let largestCost = 0;
    const largest = {
      ...hillSmallholding,
      links: hillSmallholding.links.map((l) => {
        if (!r.choices.some((c) => c.pipe === l.id)) return l;
        const p = l as PipeLink;
        const top = pipeSizes(p.series as string).at(-1)!;
        largestCost += (prices.get(`${p.series}/${top.nominal}`) as number) * p.length_m;
        return { ...p, diameter_m: top.id_m, nominal: top.nominal, rating_m: top.rating_m };
      }),
    };
    expect(solve(largest).warnings.filter((w) => w.code === 'below-minimum')).to.deep.equal([]);
    expect(r.cost).to.be.below(largestCost);
  });

  it("with the review's working share, the sized demo passes the review's rating, share and surge checks on every sized pipe (engine/review)", () => {
    const r = sizeNetwork(hillSmallholding, demoCandidates, { ratingFraction: 0.72 });
    const sized = new Set(r.choices.map((c) => c.pipe));
    const failing = reviewChecklist(r.document).rows.filter((row) => row.status === 'fail' && row.element && sized.has(row.element));
    expect(failing.map((row) => row.key)).to.deep.equal([]);
    // without the surge requirement the cheapest design is allowed to fail it somewhere
    const loose = sizeNetwork(hillSmallholding, demoCandidates, { ratingFraction: 0.72, surge: false });
    expect(loose.cost).to.be.at.most(r.cost);
  });

  it('on a looped region the surge requirement holds too: static + a·v/g within the rating at the solved flows (Joukowsky, textbook; NRCS Standard 430, V2)', () => {
    const sizes = ['1"', '1-1/4"', '1-1/2"', '2"', '2-1/2"'];
    const cands = [
      ...sizes.map((n, i) => catalogueCandidate('pvc-sdr26', n, 2 + 1.5 * i)!),
      ...sizes.map((n, i) => catalogueCandidate('pvc-sdr21', n, 2.6 + 1.9 * i)!),
    ];
    const pipe = (id: string, from: string, to: string, length_m: number) => ({
      id,
      kind: 'pipe',
      from,
      to,
      length_m,
      diameter_m: 0.05,
      roughness: 150,
      series: 'pvc-sdr21',
      nominal: '2"',
      material: 'pvc',
    });
    // A ridge tank 70–80 m above a loop A–B–C: static pressure alone is within SDR 26's 160 psi, a sudden stop is not at every size.
    const doc = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 3, level_m: 1, min_level_m: 0.1, max_level_m: 1 },
        { id: 'A', kind: 'tee', elevation_m: 30, demand_m3s: 0 },
        { id: 'B', kind: 'tee', elevation_m: 22, demand_m3s: 0 },
        { id: 'C', kind: 'tee', elevation_m: 22, demand_m3s: 0 },
        { id: 'O', kind: 'outlet', elevation_m: 20, demand_m3s: 0.0025, min_pressure_m: 10 },
      ],
      links: [pipe('P1', 'T', 'A', 300), pipe('P2', 'A', 'B', 200), pipe('P3', 'A', 'C', 250), pipe('P4', 'B', 'C', 150), pipe('P5', 'C', 'O', 100)],
    } as unknown as NetworkDocument;
    expect(partitionNetwork(doc).regions.map((r) => r.kind)).to.deep.equal(['looped']);
    const over = (d: NetworkDocument) => {
      const statics = pipeStaticPressures(d);
      const result = solve(d);
      return d.links
        .filter((l): l is PipeLink => l.kind === 'pipe')
        .filter((l) => statics.get(l.id)! + (pipeWaveSpeed(l).waveSpeed_ms * Math.abs(result.links[l.id].velocity_ms)) / 9.80665 > l.rating_m! + 1e-9)
        .map((l) => l.id);
    };
    const withSurge = sizeNetwork(doc, cands, { seed: 1 });
    expect(withSurge.feasible).to.equal(true);
    expect(over(withSurge.document)).to.deep.equal([]);
    // Without it the search is free to pick thinner, cheaper pipe that a sudden stop would over-pressure.
    const without = sizeNetwork(doc, cands, { seed: 1, surge: false });
    expect(without.feasible).to.equal(true);
    expect(without.cost).to.be.below(withSurge.cost);
    expect(over(without.document)).to.not.deep.equal([]);
  });

  it('a higher --min-pressure-m costs at least as much; an impossible one is reported, not faked', () => {
    const base = sizeNetwork(hillSmallholding, demoCandidates, {});
    const more = sizeNetwork(hillSmallholding, demoCandidates, { minPressure_m: 8 });
    expect(more.feasible).to.equal(true);
    expect(more.cost).to.be.at.least(base.cost);
    const none = sizeNetwork(hillSmallholding, demoCandidates, { minPressure_m: 40 });
    expect(none.feasible).to.equal(false);
    expect(none.regions.find((g) => g.kind === 'tree')?.note).to.match(/needs .* m of head at T2/);
  });

  it('only the chosen pipes change', () => {
    const r = sizeNetwork(hillSmallholding, demoCandidates, { pipes: ['L-TR4'] });
    expect(r.choices.map((c) => c.pipe)).to.deep.equal(['L-TR4']);
    r.document.links.forEach((l, k) => {
      if (l.id !== 'L-TR4') expect(l).to.deep.equal(hillSmallholding.links[k]);
    });
  });

  it('on random trees, dynamic programming equals brute force over every combination (the optimality identity)', () => {
    const cands: SizingCandidate[] = [
      { key: 'a', label: 'a', diameter_m: 0.02, price_per_m: 1 },
      { key: 'b', label: 'b', diameter_m: 0.03, price_per_m: 2.2 },
      { key: 'c', label: 'c', diameter_m: 0.045, price_per_m: 4.1 },
    ];
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            parent: fc.nat(),
            elev: fc.integer({ min: 0, max: 30 }),
            q: fc.integer({ min: 0, max: 8 }),
            len: fc.integer({ min: 20, max: 400 }),
            minP: fc.integer({ min: 0, max: 15 }),
          }),
          { minLength: 1, maxLength: 5 },
        ),
        fc.integer({ min: 25, max: 60 }),
        (spec, head) => {
          const doc: NetworkDocument = {
            schema: 'runnel.network/1',
            headloss: 'hazen-williams',
            nodes: [{ id: 'S', kind: 'source', elevation_m: head, head_m: head }],
            links: [],
          };
          spec.forEach((s, i) => {
            doc.nodes.push({ id: `N${i}`, kind: 'outlet', elevation_m: s.elev, demand_m3s: s.q / 10000, min_pressure_m: s.minP });
            const parent = i === 0 ? 'S' : `N${s.parent % i}`;
            doc.links.push({ id: `P${i}`, kind: 'pipe', from: parent, to: `N${i}`, length_m: s.len, diameter_m: 0.03, roughness: 150 });
          });
          const dp = sizeNetwork(doc, cands, { velocityLimit_ms: 1e9 });
          let best = Infinity;
          const n = spec.length;
          for (let code = 0; code < 3 ** n; code++) {
            let c = code;
            const trial: NetworkDocument = {
              ...doc,
              links: doc.links.map((l) => {
                const k = c % 3;
                c = Math.floor(c / 3);
                return { ...(l as PipeLink), diameter_m: cands[k].diameter_m };
              }),
            };
            const r = solve(trial);
            const ok = trial.nodes.every((nd) => nd.kind !== 'outlet' || r.nodes[nd.id].pressure_m >= (nd.min_pressure_m ?? 0) - 1e-3);
            if (ok)
              best = Math.min(
                best,
                trial.links.reduce((s, l) => s + cands.find((x) => x.diameter_m === (l as PipeLink).diameter_m)!.price_per_m * (l as PipeLink).length_m, 0),
              );
          }
          if (best === Infinity) return !dp.feasible;
          return dp.feasible && Math.abs(dp.cost - best) < 1e-6;
        },
      ),
      { numRuns: 40, seed: 7 },
    );
  });

  it('keeps the HGL above a profiled hump (the air-lock check) when it sizes', () => {
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T', kind: 'tank', elevation_m: 50, diameter_m: 2, level_m: 1, min_level_m: 0.1, max_level_m: 1.5 },
        { id: 'O', kind: 'outlet', elevation_m: 20, demand_m3s: 0.0008, min_pressure_m: 3 },
      ],
      links: [
        {
          id: 'P',
          kind: 'pipe',
          from: 'T',
          to: 'O',
          length_m: 600,
          diameter_m: 0.05,
          roughness: 150,
          profile: [
            [0, 50],
            [300, 47],
            [600, 20],
          ],
        },
      ],
    };
    const r = sizeNetwork(doc, demoCandidates, {});
    expect(r.feasible).to.equal(true);
    expect(solve(r.document).warnings.filter((w) => w.code === 'negative-pressure')).to.deep.equal([]);
    // without the profile the cheaper, smaller pipe would do: the hump is what costs
    const flat = sizeNetwork({ ...doc, links: [{ ...(doc.links[0] as PipeLink), profile: undefined }] }, demoCandidates, {});
    expect(flat.cost).to.be.below(r.cost);
  });

  describe('npm run size (engine/sizing/cli.ts)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'runnel-size-'));
    const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'engine/sizing/cli.ts', ...args], { encoding: 'utf8' });
    writeFileSync(join(dir, 'farm.json'), JSON.stringify(hillSmallholding));
    writeFileSync(join(dir, 'prices.json'), JSON.stringify(demoPriceCatalogue()));
    it('prints the sized document and its cost', () => {
      const r = run(join(dir, 'farm.json'), '--catalogue', join(dir, 'prices.json'), '--min-pressure-m', '5');
      expect(r.status, r.stderr).to.equal(0);
      const out = JSON.parse(r.stdout);
      expect(out.feasible).to.equal(true);
      // the cost re-added from the price list (series/nominal price × length of each sized pipe, C), and the
      // same answer the engine gives in-process
      const prices = new Map(demoPriceCatalogue().items.map((i) => [`${i.series}/${i.nominal}`, i.price_per_m]));
      const sized = new Set((out.choices as { pipe: string }[]).map((c) => c.pipe));
      const readded = (out.document as NetworkDocument).links
        .filter((l): l is PipeLink => l.kind === 'pipe' && sized.has(l.id))
        .reduce((sum, l) => sum + (prices.get(`${l.series}/${l.nominal}`) as number) * l.length_m, 0);
      expect(out.cost).to.be.closeTo(readded, 1e-6);
      expect(out.cost).to.be.below(out.largestCost);
      expect(out.cost).to.equal(sizeNetwork(hillSmallholding, demoCandidates, { minPressure_m: 5 }).cost);
      expect(out.document.links).to.have.length(hillSmallholding.links.length);
      expect(out.currency).to.equal('USD');
    });
    it('bad input exits 2 naming the file, row and field', () => {
      writeFileSync(join(dir, 'bad.json'), JSON.stringify({ items: [{ series: 'pvc-sch40', nominal: '1"', price_per_m: 'ten' }] }));
      const r = run(join(dir, 'farm.json'), '--catalogue', join(dir, 'bad.json'));
      expect(r.status).to.equal(2);
      expect(r.stderr).to.equal(`${join(dir, 'bad.json')}: items[0].price_per_m: must be a non-negative number (got "ten")\n`);
      expect(run(join(dir, 'farm.json')).status).to.equal(2);
      expect(run(join(dir, 'farm.json'), '--catalogue', join(dir, 'prices.json'), '--min-pressure-m', 'x').status).to.equal(2);
    });
  });
});
