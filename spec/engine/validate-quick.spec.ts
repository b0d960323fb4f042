import { expect } from 'chai';
import fc from 'fast-check';
import { BOUNDS } from '../../engine/bounds';
import { networkDocumentSchema, schemaParts } from '../../engine/document-schema';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { validateDocument } from '../../engine/validate';
import { PIPE_FIELDS, quickLinkValid, quickNodeValid, quickValid, TEE_FIELDS } from '../../engine/validate-quick';
import { loopedGrid } from '../../bench/looped-grid';

// The quick path of validation (engine/validate-quick.ts) may only ever say yes where the zod
// schema says yes; a no sends the document to the schema for its messages. Checked against the
// schema itself (the general-purpose library is the reference, C) on generated elements whose
// fields take the values at and just past every bound, wrong types, blanks and over-long strings.

const around = (b: { min: number; max: number }) => [b.min, b.min + 1e-9, b.min - 1e-9, b.max, b.max + 1e-6, b.max - 1e-6, (b.min + b.max) / 2];
const numbers = (b: { min: number; max: number }) =>
  fc.oneof(fc.constantFrom(...around(b), 0, -0, Number.NaN, Infinity, -Infinity, 1e308, -1e308), fc.double({ noDefaultInfinity: false }));
const strings = fc.oneof(
  fc.constantFrom('', ' ', '\u00a0', '\t', '\ufeff', 'J1', ' J1', 'é', 'x'.repeat(100), 'x'.repeat(101), 'x'.repeat(200), 'x'.repeat(201)),
  fc.string({ maxLength: 8 }),
);
const junk = fc.constantFrom(null, true, false, [], {}, [1, 2], { type: 'fixed' }, '3', 3, undefined);
const boolean = fc.oneof(fc.boolean(), junk);

/** A valid element with 0–3 of its fields replaced by a generated value (edge, junk) or deleted. */
function mutated(valid: Record<string, unknown>, values: Record<string, fc.Arbitrary<unknown>>) {
  const keys = Object.keys(values);
  const change = fc
    .tuple(fc.constantFrom(...keys), fc.boolean())
    .chain(([key, remove]) => (remove ? fc.constant([key, 'DELETE'] as const) : values[key].map((v) => [key, v] as const)));
  return fc.array(change, { maxLength: 3 }).map((changes) => {
    const el: Record<string, unknown> = { ...valid };
    for (const [key, v] of changes) {
      if (v === 'DELETE') delete el[key];
      else el[key] = v;
    }
    return el;
  });
}

const tee = mutated(
  { id: 'J1', kind: 'tee', elevation_m: 12.5, demand_m3s: 5e-5, name: 'Yard tee', x_m: 3, y_m: -4 },
  {
    id: fc.oneof(strings, junk),
    kind: fc.constantFrom('pipe', 'outlet', 'Tee', undefined, 'tee'),
    elevation_m: fc.oneof(numbers(BOUNDS.elevation_m), junk),
    demand_m3s: fc.oneof(numbers(BOUNDS.demand_m3s), junk),
    name: fc.oneof(strings, junk),
    x_m: fc.oneof(numbers(BOUNDS.coordinate_m), junk),
    y_m: fc.oneof(numbers(BOUNDS.coordinate_m), junk),
    notes: fc.oneof(strings, junk),
    pattern: fc.oneof(strings, junk),
    air_valve: boolean,
    drain: boolean,
    elevation_source: fc.constantFrom('survey', 'typed', undefined),
    demand_model: junk,
    extra_unknown: junk,
  },
);
const pipe = mutated(
  { id: 'P1', kind: 'pipe', from: 'J1', to: 'J2', length_m: 55, diameter_m: 0.1, roughness: 130, minor_loss: 0.5, rating_m: 100, closed: false },
  {
    id: fc.oneof(strings, junk),
    kind: fc.constantFrom('valve', 'tee', undefined, 'pipe'),
    from: fc.oneof(strings, junk),
    to: fc.oneof(strings, junk),
    length_m: fc.oneof(numbers(BOUNDS.length_m), junk),
    diameter_m: fc.oneof(numbers(BOUNDS.diameter_m), junk),
    roughness: fc.oneof(numbers(BOUNDS.roughness), junk),
    minor_loss: fc.oneof(numbers(BOUNDS.minor_loss), junk),
    rating_m: fc.oneof(numbers(BOUNDS.rating_m), junk),
    cover_m: fc.oneof(numbers(BOUNDS.cover_m), junk),
    closed: boolean,
    material: fc.oneof(strings, junk),
    series: fc.oneof(strings, junk),
    nominal: fc.oneof(strings, junk),
    profile: fc.constantFrom([[0, 10]], [[0, 1e300]], 'flat'),
    length_source: fc.constantFrom('typed', 'drawing', 'guess'),
    vertices: fc.constantFrom([[0, 0]], [[0]], []),
    extra_unknown: junk,
  },
);

describe('quick path of document validation (engine/validate-quick.ts)', () => {
  it('knows every field the schema gives a tee and a pipe (else it switches itself off for that kind)', () => {
    expect([...TEE_FIELDS].sort()).to.deep.equal(Object.keys(schemaParts.teeNode.shape).sort());
    expect([...PIPE_FIELDS].sort()).to.deep.equal(Object.keys(schemaParts.pipeLink.shape).sort());
  });

  it('accepts a tee only where the schema does (generated tees, edge values of every field)', () => {
    fc.assert(
      fc.property(tee, (el) => {
        expect(quickNodeValid(el)).to.equal(schemaParts.node.safeParse(el).success);
      }),
      { numRuns: 4000 },
    );
  });

  it('accepts a pipe only where the schema does (generated pipes, edge values of every field)', () => {
    fc.assert(
      fc.property(pipe, (el) => {
        expect(quickLinkValid(el)).to.equal(schemaParts.link.safeParse(el).success);
      }),
      { numRuns: 4000 },
    );
  });

  it('says yes to the demo farm and the 10,000-tee grid, and no wherever the schema says no', () => {
    expect(quickValid(hillSmallholding)).to.equal(true);
    expect(quickValid(loopedGrid(40, 25))).to.equal(true);
    const base = loopedGrid(4, 4);
    const cases: unknown[] = [
      { ...base, nodes: [...base.nodes, { id: 'J9', kind: 'tee', elevation_m: 1e300, demand_m3s: 0 }] },
      { ...base, links: [...base.links, { id: 'P9', kind: 'pipe', from: 'J0_0', to: 'J1_0', length_m: 10, diameter_m: 1e-300, roughness: 130 }] },
      { ...base, links: [...base.links, { id: 'P9', kind: 'pipe', from: 'J0_0', to: 'J1_0', length_m: 10, diameter_m: 0.1, roughness: 130, closed: 'false' }] },
      { ...base, nodes: [...base.nodes, { id: 'J9', kind: 'tee', elevation_m: 1, demand_m3s: 0, demand_model: { type: 'fixed' } }] },
      { ...base, nodes: [...base.nodes, { id: '   ', kind: 'tee', elevation_m: 1, demand_m3s: 0 }] },
      { ...base, schema: 'runnel.network/9' },
      { ...base, nodes: {} },
      { ...base, nodes: Array.from({ length: 20001 }, (_, i) => ({ id: `N${i}`, kind: 'tee', elevation_m: 0, demand_m3s: 0 })) },
      null,
      [],
    ];
    for (const doc of cases) {
      expect(quickValid(doc)).to.equal(false);
      expect(networkDocumentSchema.safeParse(doc).success).to.equal(false);
    }
    // and the message still names element and field, from the schema
    expect(validateDocument(cases[1])[0].message).to.equal('P9.diameter_m: must be at least 0.0005 m (got 1e-300)');
  });
});
