/**
 * The project's default cover (Profile tab) reaches every check of a design: the Review checklist,
 * the Options summary and sizing read it for pipes without a cover of their own, and sizing does
 * not write it onto the designer's pipes. The expected differences are geometry: lowering a pipe by
 * Δ cover raises the HGL's clearance over it by exactly Δ (the HGL does not depend on burial).
 */
import { expect } from 'chai';
import type { NetworkDocument, PipeLink } from '../../engine';
import { withProjectCover } from '../../engine/checks';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { evaluateDesign } from '../../engine/options/compare';
import { reviewChecklist } from '../../engine/review';
import { parsePriceCatalogue } from '../../engine/sizing/price-catalogue';
import { demoPriceCatalogue } from '../../engine/examples/demo-prices';
import { sizeNetwork } from '../../engine/sizing/size-network';

/** A ridge tank (water surface 102 m) feeding one outlet over a hump 5.5 m above the water surface. */
function humpLine(ownCover?: number): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 2, level_m: 2, min_level_m: 0.2, max_level_m: 2 },
      { id: 'O', kind: 'outlet', elevation_m: 40, demand_m3s: 0.0002, min_pressure_m: 10, outlet_type: 'hose-bib' },
    ],
    links: [
      {
        id: 'P',
        kind: 'pipe',
        from: 'T',
        to: 'O',
        length_m: 100,
        diameter_m: 0.03,
        roughness: 150,
        ...(ownCover === undefined ? {} : { cover_m: ownCover }),
        profile: [
          [0, 100],
          [50, 107.5],
          [100, 40],
        ],
      },
    ],
  };
}
const hglRow = (doc: NetworkDocument, cover_m?: number) => reviewChecklist(doc, { cover_m }).rows.find((r) => r.rule === 'pipe-hgl' && r.element === 'P')!;

describe('project cover (Profile tab) in the checks', () => {
  it('the Review HGL check reads the project cover for a pipe without its own: 6 m more cover clears the hump by 6 m more', () => {
    const usual = hglRow(humpLine()).measured!.value;
    const deep = hglRow(humpLine(), 6.45).measured!.value;
    expect(deep - usual).to.be.closeTo(6, 1e-9);
    expect(hglRow(humpLine()).status).to.equal('fail');
    // the HGL at mid-length is about 102 m less half the friction; the pipe at 107.5 − 6.45 = 101.05 m sits below it
    expect(hglRow(humpLine(), 6.45).status).to.equal('pass');
  });

  it("a pipe's own cover wins over the project's", () => {
    expect(hglRow(humpLine(0.45), 6.45).measured!.value).to.be.closeTo(hglRow(humpLine(0.45)).measured!.value, 1e-12);
    expect(withProjectCover(humpLine(0.3), 2).links[0]).to.have.property('cover_m', 0.3);
    expect(withProjectCover(humpLine(), null)).to.deep.equal(humpLine());
  });

  it('the Options summary counts failing checks with the project cover', () => {
    const prices = { prices: new Map<string, number | null>() };
    expect(evaluateDesign(humpLine(), prices).summary.failingChecks).to.be.greaterThan(
      evaluateDesign(humpLine(), { ...prices, cover_m: 6.45 }).summary.failingChecks,
    );
  });

  it('sizing checks with the project cover but leaves the pipes without a cover of their own', () => {
    const candidates = parsePriceCatalogue(demoPriceCatalogue()).candidates;
    const r = sizeNetwork(hillSmallholding, candidates, { cover_m: 1.2 });
    const drawnWithout = new Set(hillSmallholding.links.filter((l) => l.kind === 'pipe' && l.cover_m === undefined).map((l) => l.id));
    expect(drawnWithout.size).to.be.greaterThan(0);
    for (const l of r.document.links) if (drawnWithout.has(l.id)) expect((l as PipeLink).cover_m, l.id).to.equal(undefined);
  });
});
