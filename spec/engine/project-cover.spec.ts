/**
 * The project's default cover (Profile tab) reaches every check of a design: the Review checklist,
 * the Options summary and sizing read it for pipes without a cover of their own, and sizing does
 * not write it onto the designer's pipes. The expected differences are geometry: lowering a pipe by
 * Δ cover raises the HGL's clearance over it by exactly Δ (the HGL does not depend on burial).
 */
import { expect } from 'chai';
import type { NetworkDocument, PipeLink } from '../../engine';
import { humpLine } from './hump-line';
import { withProjectCover } from '../../engine/checks';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { evaluateDesign } from '../../engine/options/compare';
import { reviewChecklist } from '../../engine/review';
import { parsePriceCatalogue } from '../../engine/sizing/price-catalogue';
import { demoPriceCatalogue } from '../../engine/examples/demo-prices';
import { sizeNetwork } from '../../engine/sizing/size-network';

/** The hump 5.5 m above the water surface: fails under the default cover, clears under 6.45 m. */
const HUMP_M = 107.5;
const hglRow = (doc: NetworkDocument, cover_m?: number) => reviewChecklist(doc, { cover_m }).rows.find((r) => r.rule === 'pipe-hgl' && r.element === 'P')!;

describe('project cover (Profile tab) in the checks', () => {
  it('the Review HGL check reads the project cover for a pipe without its own: 6 m more cover clears the hump by 6 m more', () => {
    const usual = hglRow(humpLine(HUMP_M)).measured!.value;
    const deep = hglRow(humpLine(HUMP_M), 6.45).measured!.value;
    expect(deep - usual).to.be.closeTo(6, 1e-9);
    expect(hglRow(humpLine(HUMP_M)).status).to.equal('fail');
    // the HGL at mid-length is about 102 m less half the friction; the pipe at 107.5 − 6.45 = 101.05 m sits below it
    expect(hglRow(humpLine(HUMP_M), 6.45).status).to.equal('pass');
  });

  it("a pipe's own cover wins over the project's", () => {
    expect(hglRow(humpLine(HUMP_M, 0.45), 6.45).measured!.value).to.be.closeTo(hglRow(humpLine(HUMP_M, 0.45)).measured!.value, 1e-12);
    expect(withProjectCover(humpLine(HUMP_M, 0.3), 2).links[0]).to.have.property('cover_m', 0.3);
    expect(withProjectCover(humpLine(HUMP_M), null)).to.deep.equal(humpLine(HUMP_M));
  });

  it('the Options summary counts failing checks with the project cover', () => {
    const prices = { prices: new Map<string, number | null>() };
    const shallow = evaluateDesign(humpLine(HUMP_M), prices).summary.failingChecks;
    const deep = evaluateDesign(humpLine(HUMP_M), { ...prices, cover_m: 6.45 }).summary.failingChecks;
    expect(shallow).to.be.a('number');
    expect(deep).to.be.a('number');
    expect(shallow!).to.be.greaterThan(deep!);
  });

  it('sizing checks with the project cover but leaves the pipes without a cover of their own', () => {
    const candidates = parsePriceCatalogue(demoPriceCatalogue()).candidates;
    const r = sizeNetwork(hillSmallholding, candidates, { cover_m: 1.2 });
    const drawnWithout = new Set(hillSmallholding.links.filter((l) => l.kind === 'pipe' && l.cover_m === undefined).map((l) => l.id));
    expect(drawnWithout.size).to.be.greaterThan(0);
    for (const l of r.document.links) if (drawnWithout.has(l.id)) expect((l as PipeLink).cover_m, l.id).to.equal(undefined);
  });
});
