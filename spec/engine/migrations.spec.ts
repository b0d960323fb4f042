import { expect } from 'chai';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { documentVersion, migrateDocument } from '../../engine/migrations';
import { NETWORK_SCHEMA, SCHEMA_VERSION } from '../../engine/document-schema';
import { solve } from '../../engine/steady';
import { parseDocument } from '../../engine/validate';

// Saved designs keep opening: every older version of the format is migrated to the current one.
// One document per version the program has written (add one with each new migration step).
const current = JSON.parse(JSON.stringify(hillSmallholding)) as Record<string, unknown>;
const { schema: _schema, headloss: _headloss, ...version0 } = current;

describe('document versions (engine/migrations.ts)', () => {
  it('a design saved under the current version opens unchanged (the same object, unknown fields kept)', () => {
    const withExtra = { ...current, editor_note: 'kept' };
    const parsed = parseDocument(withExtra);
    expect(parsed.ok).to.equal(true);
    if (!parsed.ok) return;
    expect(parsed.doc).to.equal(withExtra);
    expect(parsed.from).to.equal(SCHEMA_VERSION);
  });

  it('a version-0 design (no schema tag, no head-loss model) opens as the current version with Hazen-Williams', () => {
    expect(documentVersion(version0)).to.equal(0);
    const parsed = parseDocument(version0);
    expect(parsed.ok).to.equal(true);
    if (!parsed.ok) return;
    expect(parsed.from).to.equal(0);
    expect(parsed.doc).to.deep.equal({ ...version0, schema: NETWORK_SCHEMA, headloss: 'hazen-williams' });
    // …and solves to the same heads as the current-version document.
    const a = solve(version0);
    const b = solve(current);
    expect(a.converged).to.equal(true);
    expect(a.nodes).to.deep.equal(b.nodes);
  });

  it('a version-0 Darcy-Weisbach design keeps its model', () => {
    const migrated = migrateDocument({ ...version0, headloss: 'darcy-weisbach' });
    expect(migrated.ok && (migrated.doc as { headloss: string }).headloss).to.equal('darcy-weisbach');
  });

  it('a version newer than this program, or a tag that is not ours, is refused naming the schema field', () => {
    expect(parseDocument({ ...current, schema: `runnel.network/${SCHEMA_VERSION + 1}` }).warnings[0].message).to.equal(
      `document.schema: "runnel.network/${SCHEMA_VERSION + 1}" is newer than this program reads ("${NETWORK_SCHEMA}"); update Runnel to open it`,
    );
    expect(parseDocument({ ...current, schema: 'something/else' }).warnings[0].message).to.match(
      /^document\.schema: must be "runnel\.network\/1" or an earlier/,
    );
  });
});
