import { expect } from 'chai';
import type session from 'express-session';
import { DrizzleSessionStore } from '../../server/auth/session-store';
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
});
