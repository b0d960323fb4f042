/** A window whose saved version was replaced elsewhere: when it checks, and what it does. */
import { expect } from 'chai';
import { emptyDocument } from '../../client/src/app/screens/layout/editor/document-store';
import { decideOnServerCopy, FreshnessCheck } from '../../client/src/app/screens/layout/editor/freshness-check';
import { SaveController, SaveStatus, ServerCopy } from '../../client/src/app/screens/layout/editor/save-controller';
import { ManualTimers } from './manual-timers';

const flush = () => new Promise<void>((r) => setImmediate(r));
const copy = (version: number): ServerCopy => ({ version, document: { ...emptyDocument(), title: 'v' + version }, updatedBy: 'Dana Designer' });

function setup(status: SaveStatus = 'saved', version = 4) {
  const timers = new ManualTimers();
  const server = { copy: copy(version), gets: 0, fail: false };
  const acts: [string, number][] = [];
  const state = { status, version };
  const f = new FreshnessCheck(
    async () => {
      server.gets++;
      if (server.fail) throw new Error('offline');
      return server.copy;
    },
    timers,
    () => state,
    (d, c) => acts.push([d, c.version]),
    () => timers.now,
  );
  return { timers, server, acts, state, f };
}

describe('Layout editor: checking for a newer saved version', () => {
  it('decides: same or older version → nothing; newer with nothing unsaved → reload; newer with local changes → conflict; saving, loading, read-only → wait', () => {
    expect(decideOnServerCopy('saved', 4, copy(4))).to.equal('none');
    expect(decideOnServerCopy('saved', 5, copy(4))).to.equal('none');
    expect(decideOnServerCopy('saved', 4, copy(5))).to.equal('reload');
    for (const s of ['dirty', 'offline', 'rejected'] as SaveStatus[]) expect(decideOnServerCopy(s, 4, copy(5)), s).to.equal('conflict');
    for (const s of ['saving', 'loading', 'read-only', 'conflict'] as SaveStatus[]) expect(decideOnServerCopy(s, 4, copy(5)), s).to.equal('none');
  });

  it('checks when the tab becomes visible, then every 30 s while visible, and stops while hidden', async () => {
    const s = setup();
    s.f.setVisible(true);
    await flush();
    expect(s.server.gets).to.equal(1);
    s.timers.advance(29999);
    await flush();
    expect(s.server.gets).to.equal(1);
    s.timers.advance(1);
    await flush();
    expect(s.server.gets).to.equal(2);
    s.f.setVisible(false);
    s.timers.advance(120000);
    await flush();
    expect(s.server.gets).to.equal(2);
    expect(s.timers.pending).to.equal(0);
    s.f.setVisible(true);
    await flush();
    expect(s.server.gets).to.equal(3);
    expect(s.acts).to.deep.equal([]);
  });

  it('focus checks at once, but not twice within 2 s', async () => {
    const s = setup();
    s.f.setVisible(true);
    await flush();
    s.f.focused();
    await flush();
    expect(s.server.gets).to.equal(1);
    s.timers.advance(2000);
    s.f.focused();
    await flush();
    expect(s.server.gets).to.equal(2);
  });

  it('a newer version with nothing unsaved is reloaded; with unsaved changes the conflict is raised; offline is quietly retried', async () => {
    const s = setup('saved', 4);
    s.f.setVisible(true);
    await flush();
    s.server.copy = copy(6);
    s.timers.advance(30000);
    await flush();
    expect(s.acts).to.deep.equal([['reload', 6]]);
    s.state.version = 6;
    s.state.status = 'dirty';
    s.server.copy = copy(7);
    s.server.fail = true;
    s.timers.advance(30000);
    await flush();
    expect(s.acts).to.have.length(1);
    s.server.fail = false;
    s.timers.advance(30000);
    await flush();
    expect(s.acts).to.deep.equal([
      ['reload', 6],
      ['conflict', 7],
    ]);
  });

  it('SaveController.raiseConflict stops autosave and keeps the local document until the user chooses', async () => {
    const timers = new ManualTimers();
    let doc = emptyDocument();
    const puts: number[] = [];
    const put = async (v: number) => {
      puts.push(v);
      return { kind: 'saved' as const, version: v + 1 };
    };
    const c = new SaveController({ put }, timers, () => doc);
    c.loaded(4);
    doc = { ...doc, title: 'mine' };
    c.changed();
    c.raiseConflict(copy(5));
    expect(c.status).to.equal('conflict');
    timers.advance(10000);
    await flush();
    expect(puts).to.deep.equal([]);
    c.keepMine();
    await flush();
    expect(puts).to.deep.equal([5]);
    expect(c.status).to.equal('saved');
  });
});
