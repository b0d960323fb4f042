/** Autosave and conflict handling of the Layout editor, with hand-stepped timers. */
import { expect } from 'chai';
import { emptyDocument } from '../../client/src/app/screens/layout/editor/document-store';
import { PutOutcome, SaveController, SaveStatus } from '../../client/src/app/screens/layout/editor/save-controller';
import type { NetworkDocument } from '../../engine/network-document';
import { ManualTimers } from './manual-timers';

const flush = () => new Promise<void>((r) => setImmediate(r));

function setup(answers: PutOutcome[]) {
  const timers = new ManualTimers();
  let doc: NetworkDocument = emptyDocument();
  const puts: { version: number; doc: NetworkDocument }[] = [];
  const statuses: SaveStatus[] = [];
  const backend = {
    put: async (version: number, d: NetworkDocument) => {
      puts.push({ version, doc: d });
      return answers.shift() ?? { kind: 'saved' as const, version: version + 1 };
    },
  };
  const c = new SaveController(
    backend,
    timers,
    () => doc,
    (s) => statuses.push(s),
  );
  const edit = () => {
    doc = { ...doc, title: 'edit ' + puts.length + Math.random() };
    c.changed();
  };
  return { timers, c, puts, statuses, edit, getDoc: () => doc };
}

describe('Layout editor: autosave', () => {
  it('saves once, 1.5 s after the last of several quick edits, with the loaded version', async () => {
    const s = setup([]);
    s.c.loaded(4);
    s.edit();
    s.timers.advance(1000);
    s.edit();
    s.timers.advance(1000);
    expect(s.puts).to.have.length(0);
    expect(s.c.status).to.equal('dirty');
    s.timers.advance(600);
    await flush();
    expect(s.puts.map((p) => p.version)).to.deep.equal([4]);
    expect(s.c.status).to.equal('saved');
    expect(s.c.version).to.equal(5);
    expect(s.statuses).to.include.members(['dirty', 'saving', 'saved']);
  });

  it('on 409 keeps the local document, stops autosaving, and "Keep mine" re-saves over the new version', async () => {
    const theirs = { version: 9, document: emptyDocument(), updatedBy: 'someone' };
    const s = setup([{ kind: 'conflict', current: theirs }]);
    s.c.loaded(4);
    s.edit();
    s.timers.advance(1500);
    await flush();
    expect(s.c.status).to.equal('conflict');
    const mine = s.getDoc();
    s.edit();
    s.timers.advance(5000);
    expect(s.puts).to.have.length(1); // no silent overwrite
    expect(s.getDoc()).to.not.equal(theirs.document);
    s.c.keepMine();
    await flush();
    expect(s.puts[1].version).to.equal(9);
    expect(s.puts[1].doc).to.not.equal(mine); // the latest local edit is what gets saved
    expect(s.c.status).to.equal('saved');
  });

  it('"Load theirs" hands back the server copy and marks it saved', async () => {
    const theirs = { version: 9, document: emptyDocument() };
    const s = setup([{ kind: 'conflict', current: theirs }]);
    s.c.loaded(1);
    s.edit();
    s.timers.advance(1500);
    await flush();
    expect(s.c.takeTheirs()).to.equal(theirs);
    expect(s.c.status).to.equal('saved');
    expect(s.c.version).to.equal(9);
  });

  it('keeps the base both sides of a conflict started from: the loaded copy, then each saved copy, then theirs once resolved', async () => {
    const theirs = { version: 9, document: { ...emptyDocument(), title: 'theirs' } };
    const s = setup([
      { kind: 'saved', version: 5 },
      { kind: 'conflict', current: theirs },
    ]);
    s.c.loaded(4);
    const loadedDoc = s.getDoc();
    expect(s.c.base).to.equal(loadedDoc);
    s.edit();
    s.timers.advance(1500);
    await flush();
    const saved = s.puts[0].doc;
    expect(s.c.base).to.equal(saved);
    s.edit();
    s.timers.advance(1500);
    await flush();
    expect(s.c.status).to.equal('conflict');
    expect(s.c.base, 'the conflict is summarised against the last saved copy').to.equal(saved);
    s.c.keepMine();
    expect(s.c.base).to.equal(theirs.document);
  });

  it('when offline retries with doubling back-off (2 s, 4 s, 8 s…) and recovers', async () => {
    const s = setup([{ kind: 'offline' }, { kind: 'offline' }, { kind: 'offline' }]);
    s.c.loaded(1);
    s.edit();
    s.timers.advance(1500);
    await flush();
    expect(s.c.status).to.equal('offline');
    s.timers.advance(1999);
    expect(s.puts).to.have.length(1);
    s.timers.advance(1);
    await flush();
    expect(s.puts).to.have.length(2);
    s.timers.advance(4000);
    await flush();
    expect(s.puts).to.have.length(3);
    s.timers.advance(7999);
    expect(s.puts).to.have.length(3);
    s.timers.advance(1);
    await flush();
    expect(s.puts).to.have.length(4);
    expect(s.c.status).to.equal('saved');
  });

  it('an edit made while a save is in flight is saved afterwards', async () => {
    const s = setup([]);
    s.c.loaded(1);
    s.edit();
    s.timers.advance(1500); // put sent, not yet answered
    s.edit();
    await flush();
    expect(s.c.status).to.equal('dirty');
    s.timers.advance(1500);
    await flush();
    expect(s.puts.map((p) => p.version)).to.deep.equal([1, 2]);
    expect(s.c.status).to.equal('saved');
  });

  it('read-only never saves', () => {
    const s = setup([]);
    s.c.loaded(1);
    s.c.setReadOnly();
    s.edit();
    s.timers.advance(10000);
    expect(s.puts).to.have.length(0);
    expect(s.c.status).to.equal('read-only');
  });
});

describe('Layout editor: autosave across documents', () => {
  it('an answer to a save sent before loading another document is ignored', async () => {
    let release: (o: PutOutcome) => void = () => undefined;
    const timers = new ManualTimers();
    let doc: NetworkDocument = emptyDocument();
    const backend = { put: () => new Promise<PutOutcome>((r) => (release = r)) };
    const c = new SaveController(backend, timers, () => doc);
    c.loaded(3);
    doc = { ...doc, title: 'A' };
    c.changed();
    timers.advance(1500); // save of document A in flight
    c.loaded(7); // another project's document arrives
    release({ kind: 'saved', version: 4 });
    await flush();
    expect(c.version).to.equal(7);
    expect(c.status).to.equal('saved');
  });
});
