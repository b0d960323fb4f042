import { expect } from 'chai';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { solve } from '../../engine/steady';
import { simulate } from '../../engine/simulate';
import { validateDocument } from '../../engine/validate';

const base = () =>
  ({
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'S1', kind: 'source', elevation_m: 50, head_m: 50 },
      { id: 'J1', kind: 'tee', elevation_m: 10, demand_m3s: 0.001 },
    ],
    links: [{ id: 'P3', kind: 'pipe', from: 'S1', to: 'J1', length_m: 100, diameter_m: 0.05, roughness: 150 }],
  }) as { nodes: Record<string, unknown>[]; links: Record<string, unknown>[]; [k: string]: unknown };

describe('validateDocument (validate.ts): boundary checks name element and field', () => {
  it('accepts a good document and ignores unknown editor fields', () => {
    const doc = base();
    doc.nodes[0]['x_m'] = 12;
    doc.nodes[0]['name'] = 'Spring box';
    doc.links[0]['vertices'] = [[1, 2]];
    doc['layout'] = { zoom: 2 };
    doc['whatever'] = true;
    expect(validateDocument(doc)).to.deep.equal([]);
    expect(validateDocument(hillSmallholding)).to.deep.equal([]);
  });
  it('zero diameter: exact message', () => {
    const doc = base();
    doc.links[0]['diameter_m'] = 0;
    expect(validateDocument(doc)).to.deep.equal([{ code: 'invalid', element: 'P3', message: 'P3.diameter_m: must be a positive number (got 0)' }]);
  });
  it('negative length', () => {
    const doc = base();
    doc.links[0]['length_m'] = -5;
    expect(validateDocument(doc)).to.deep.equal([{ code: 'invalid', element: 'P3', message: 'P3.length_m: must be a positive number (got -5)' }]);
  });
  it('missing node referenced by a link', () => {
    const doc = base();
    doc.links[0]['to'] = 'J9';
    expect(validateDocument(doc)).to.deep.equal([{ code: 'invalid', element: 'P3', message: 'P3.to: must name an existing node (got "J9")' }]);
  });
  it('unknown kind of node and of link', () => {
    const doc = base();
    doc.nodes[1]['kind'] = 'windmill';
    doc.links[0]['kind'] = 'aqueduct';
    expect(validateDocument(doc).map((w) => w.message)).to.deep.equal([
      'J1.kind: must be one of source, tank, tee, outlet (got "windmill")',
      'P3.kind: must be one of pipe, pump, valve (got "aqueduct")',
    ]);
  });
  it('missing numbers first (the schema); then duplicate ids and bad tank levels (the cross-element checks)', () => {
    const doc = base();
    doc.nodes.push({ id: 'J1', kind: 'tee', elevation_m: 1, demand_m3s: 0 });
    doc.nodes.push({ id: 'T1', kind: 'tank', elevation_m: 1, diameter_m: 2, level_m: 3, min_level_m: 0.1, max_level_m: 2 });
    doc.nodes.push({ id: 'O1', kind: 'outlet', demand_m3s: 0.001 });
    expect(validateDocument(doc).map((w) => w.message)).to.deep.equal(['O1.elevation_m: must be a number (got nothing)']);
    doc.nodes[4]['elevation_m'] = 3;
    expect(validateDocument(doc).map((w) => w.message)).to.deep.equal(['J1.id: is used by another node', 'T1.level_m: must not exceed max_level_m 2 (got 3)']);
  });
  it('not an object, nodes not an array', () => {
    expect(validateDocument(null)[0].message).to.equal('document: must be a JSON object (got null)');
    expect(validateDocument({ nodes: 3, links: [] })[0].message).to.equal('document.nodes: must be an array (got 3)');
  });
  it('pump and valve fields: controls must name tanks, curves must fall', () => {
    const doc = base();
    doc.links.push({
      id: 'PU',
      kind: 'pump',
      from: 'S1',
      to: 'J1',
      curve: [
        [0, 10],
        [0.01, 20],
      ],
      control: { tank: 'J1', stop_level_m: 1, start_level_m: 2 },
    });
    doc.links.push({ id: 'V1', kind: 'valve', valve_type: 'gate', from: 'S1', to: 'J1', diameter_m: 0.05 });
    expect(validateDocument(doc).map((w) => w.message)).to.deep.equal(['V1.valve_type: must be shutoff, check, prv or float (got "gate")']);
    doc.links[2]['valve_type'] = 'float';
    expect(validateDocument(doc).map((w) => w.message)).to.deep.equal([
      'PU.curve: head must fall as flow rises, with distinct flows',
      'PU.control.tank: must name a tank (got "J1")',
      'PU.control.start_level_m: must be below stop_level_m 1 (got 2)',
      'V1.tank: must name a tank (got nothing)',
    ]);
  });
});

describe('solve and simulate on bad input: no throw, converged false', () => {
  it('solve returns the invalid warnings', () => {
    const doc = base();
    doc.links[0]['diameter_m'] = 0;
    const result = solve(doc);
    expect(result.converged).to.equal(false);
    expect(result.warnings).to.deep.equal([{ code: 'invalid', element: 'P3', message: 'P3.diameter_m: must be a positive number (got 0)' }]);
  });
  it('no fixed head: a structurally valid draft, but solve answers no-fixed-head', () => {
    const doc = base();
    doc.nodes[0] = { id: 'S1', kind: 'tee', elevation_m: 50, demand_m3s: 0 };
    expect(validateDocument(doc)).to.deep.equal([]);
    const result = solve(doc);
    expect(result.converged).to.equal(false);
    expect(result.warnings.map((w) => w.code)).to.deep.equal(['no-fixed-head']);
    expect(simulate(doc, { duration_s: 3600, step_s: 600 }).warnings.map((w) => w.code)).to.deep.equal(['no-fixed-head']);
  });
  it('simulate rejects a bad step', () => {
    expect(simulate(base(), { duration_s: 3600, step_s: 0 }).warnings[0].code).to.equal('invalid');
  });
});
