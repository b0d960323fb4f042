/** Engine warnings as the Layout screen words them, in the project's units. */
import { expect } from 'chai';
import { documentWarnings, resultWarnings } from '../../client/src/app/screens/layout/editor/result-checks';
import type { SteadyResult } from '../../engine/index';
import type { NetworkDocument } from '../../engine/network-document';

const doc: NetworkDocument = {
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  nodes: [
    { id: 'T1', kind: 'tank', elevation_m: 40, diameter_m: 1.6, level_m: 1, min_level_m: 0.1, max_level_m: 1.5 },
    { id: 'O1', kind: 'outlet', elevation_m: 30, demand_m3s: 0.0003, min_pressure_m: 14.06 },
  ],
  links: [{ id: 'P1', kind: 'pipe', from: 'T1', to: 'O1', length_m: 100, diameter_m: 0.02, roughness: 140, rating_m: 5 }],
};

function result(warnings: SteadyResult['warnings']): SteadyResult {
  return {
    converged: true,
    iterations: 3,
    warnings,
    nodes: { T1: { head_m: 41, pressure_m: 1, demand_m3s: 0 }, O1: { head_m: 37.03, pressure_m: 7.03, demand_m3s: 0.0003 } },
    links: { P1: { flow_m3s: 0.0003, velocity_ms: 1.9, headloss_m: 4, status: 'open' } },
  } as unknown as SteadyResult;
}

describe('Layout editor: result warnings', () => {
  it('rewords below-minimum in psi for US projects (7.03 m of water ≈ 10 psi; 1 psi = 6894.757 Pa, NIST SP 811)', () => {
    const w = resultWarnings(doc, result([{ code: 'below-minimum', element: 'O1', message: 'O1: pressure 7.03 m is below 14.06 m' }]), 'us');
    expect(w.get('O1')).to.deep.equal(['Below minimum pressure: 10.0 psi < 20.0 psi']);
  });

  it('adds the caution to an over-rating pipe and keeps unknown codes in the engine words', () => {
    const w = resultWarnings(
      doc,
      result([
        { code: 'over-rating', element: 'P1', message: 'P1: over rating' },
        { code: 'disconnected', element: 'O1', message: 'O1: not connected to a source or tank' },
        { code: 'not-converged', element: null, message: 'The solver did not converge' },
      ] as SteadyResult['warnings']),
      'si',
    );
    expect(w.get('P1')?.[0]).to.match(/pressure rating \(49 kPa\).*follow local codes/);
    expect(w.get('O1')).to.deep.equal(['not connected to a source or tank']);
    expect(
      documentWarnings(result([{ code: 'not-converged', element: null, message: 'The solver did not converge' }] as SteadyResult['warnings'])),
    ).to.deep.equal(['The solver did not converge']);
  });

  it("shows names, not ids: the leading id goes (the warning sits under the element's name) and ids inside a message become names", () => {
    const named: NetworkDocument = { ...doc, nodes: doc.nodes.map((n) => ({ ...n, name: n.id === 'T1' ? 'Ridge tank' : 'Garden tap' })) };
    const res = result([
      { code: 'disconnected', element: 'O1', message: 'O1: no open path to a source or tank' },
      { code: 'tank-empty', element: null, message: 'T1 and O1 are not joined (T10 is not an element)' },
    ] as SteadyResult['warnings']);
    expect(resultWarnings(named, res, 'si').get('O1')).to.deep.equal(['no open path to a source or tank']);
    expect(documentWarnings(res, named)).to.deep.equal(['Ridge tank and Garden tap are not joined (T10 is not an element)']);
  });

  it('gives nothing without results', () => {
    expect(resultWarnings(doc, null, 'us').size).to.equal(0);
  });
});
