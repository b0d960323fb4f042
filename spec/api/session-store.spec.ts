import { expect } from 'chai';
import type session from 'express-session';
import { DrizzleSessionStore, TOUCH_EVERY_MS } from '../../server/auth/session-store';
import { openDatabase, type Database } from '../../server/db';

const call = <T>(fn: (cb: (err: unknown, value?: T) => void) => void) =>
  new Promise<T | undefined>((resolve, reject) => fn((err, value) => (err ? reject(err) : resolve(value))));

function data(expires: Date, teamId: string): session.SessionData {
  return { cookie: { originalMaxAge: 1000, expires, httpOnly: true, path: '/' } as session.Cookie, teamId };
}

describe('session store over Drizzle', () => {
  let database: Database;
  let store: DrizzleSessionStore;
  before(async () => {
    database = await openDatabase({ kind: 'pglite' });
    store = new DrizzleSessionStore(database.db);
  });
  after(async () => {
    store.stop();
    await database.close();
  });

  it('sets, gets, overwrites and destroys a session', async () => {
    const later = new Date(Date.now() + 60_000);
    await call((cb) => store.set('sid-1', data(later, 'team-a'), cb));
    expect((await call<session.SessionData | null>((cb) => store.get('sid-1', cb)))?.teamId).to.equal('team-a');
    await call((cb) => store.set('sid-1', data(later, 'team-b'), cb));
    expect((await call<session.SessionData | null>((cb) => store.get('sid-1', cb)))?.teamId).to.equal('team-b');
    await call((cb) => store.destroy('sid-1', cb));
    expect(await call((cb) => store.get('sid-1', cb))).to.equal(null);
  });

  it('treats an expired session as absent, and prune() deletes it', async () => {
    await call((cb) => store.set('old', data(new Date(Date.now() - 1000), 'team-a'), cb));
    expect(await call((cb) => store.get('old', cb))).to.equal(null);
    await store.prune();
    const rows = await database.db.query.sessions.findMany();
    expect(rows.map((r) => r.sid)).to.not.include('old');
  });

  it('touch() moves the expiry forward', async () => {
    await call((cb) => store.set('t', data(new Date(Date.now() + 1000), 'x'), cb));
    const later = new Date(Date.now() + 3_600_000);
    await call((cb) => store.touch('t', data(later, 'x'), cb));
    const row = await database.db.query.sessions.findFirst({ where: (s, { eq }) => eq(s.sid, 't') });
    expect(row!.expires.getTime()).to.equal(later.getTime());
  });

  it('touch() moves the expiry only when that gains a minute or more (no write per request)', async () => {
    const stored = new Date(Date.now() + 3_600_000);
    await call((cb) => store.set('m', data(stored, 'x'), cb));
    const expiryOfRow = async () => (await database.db.query.sessions.findFirst({ where: (s, { eq }) => eq(s.sid, 'm') }))!.expires.getTime();
    // As express-session does it: get() then touch() with the cookie's new expiry.
    await call((cb) => store.get('m', cb));
    await call((cb) => store.touch('m', data(new Date(stored.getTime() + 30_000), 'x'), cb));
    expect(await expiryOfRow()).to.equal(stored.getTime());
    // Without a get() first (another instance read it): the conditional update writes nothing either.
    await call((cb) => store.touch('m', data(new Date(stored.getTime() + 59_000), 'x'), cb));
    expect(await expiryOfRow()).to.equal(stored.getTime());
    await call((cb) => store.get('m', cb));
    const later = new Date(stored.getTime() + TOUCH_EVERY_MS + 1000);
    await call((cb) => store.touch('m', data(later, 'x'), cb));
    expect(await expiryOfRow()).to.equal(later.getTime());
  });

  it('purges expired sessions by itself (soon after start, then on its timer)', async () => {
    await call((cb) => store.set('gone', data(new Date(Date.now() - 1000), 'x'), cb));
    await call((cb) => store.set('kept', data(new Date(Date.now() + 60_000), 'x'), cb));
    const own = new DrizzleSessionStore(database.db, 20);
    try {
      let sids: string[] = [];
      for (let i = 0; i < 200; i++) {
        sids = (await database.db.query.sessions.findMany()).map((r) => r.sid);
        if (!sids.includes('gone')) break;
        await new Promise((r) => setTimeout(r, 25));
      }
      expect(sids).to.not.include('gone');
      expect(sids).to.include('kept');
    } finally {
      own.stop();
    }
  });
});
