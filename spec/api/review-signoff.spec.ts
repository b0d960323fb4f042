/** The sign-off workflow through the API: states, frozen versions, pinned comments, e-mails and audit. */
import { expect } from 'chai';
import { eq } from 'drizzle-orm';
import { auditLog, memberships, networkVersions, reviewComments } from '../../drizzle/schema';
import { SMALL_NETWORK, demoUserRow, insertSavedProject } from './fixtures';
import { startTestApp, type TestApp } from './test-app';

interface Mail {
  to: string;
  subject: string;
  text: string;
}

describe('API: review sign-off and comments', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  const v = (id: string, rest: string) => `/api/projects/${id}${rest}`;
  const mails = async (): Promise<Mail[]> => (await (await t.signInAs('admin')).get('/api/team/outbox').expect(200)).body;
  const status = async (id: string, n: number) => (await (await t.signInAs('owner')).get(v(id, `/versions/${n}`)).expect(200)).body.status;

  it("the demo seed has a submitted version 1 with the designer's note", async () => {
    const res = await (await t.signInAs('reviewer')).get(v(t.seeded!.demoProjectId, '/versions')).expect(200);
    const v1 = res.body.versions.find((x: { version: number }) => x.version === 1);
    expect(v1).to.include({ status: 'submitted', statusBy: 'Dana Designer' });
    expect(v1.statusNote).to.match(/south trough line/);
  });

  it('submit → return with a pinned comment → fix → submit → approve; each step mails the people concerned with a working link and is audited', async () => {
    const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
    const designer = await t.signInAs('designer');
    const reviewer = await t.signInAs('reviewer');
    const before = (await mails()).length;

    await designer.post(v(id, '/versions/1/submit'), { note: 'Ready for a look' }).expect(200, { version: 1, status: 'submitted' });
    let box = (await mails()).slice(0, (await mails()).length - before);
    const submitMails = box.filter((m) => m.subject.includes('version 1 submitted for review'));
    expect(submitMails.map((m) => m.to).sort()).to.deep.equal(['owner@runnel.test', 'reviewer@runnel.test']);
    expect(submitMails[0].text).to.include(`http://runnel.test/projects/${id}/review?version=1`);
    expect(submitMails[0].text).to.include('Ready for a look');

    const pin = await reviewer.post(v(id, '/comments'), { version: 1, element: 'P1', body: 'Pipe P1 is close to its rating at the bottom' }).expect(201);
    expect(pin.body).to.include({ version: 1, element: 'P1', resolved: false, createdBy: 'Riley Reviewer' });
    await reviewer.post(v(id, '/versions/1/return'), { note: 'See the pinned comment on P1' }).expect(200, { version: 1, status: 'returned' });
    box = await mails();
    const returned = box.filter((m) => m.subject.includes('version 1 returned with comments'));
    expect(returned.map((m) => m.to).sort()).to.deep.equal(['designer@runnel.test', 'owner@runnel.test']);
    expect(returned[0].text).to.match(/Open comments: 1/);

    // The designer sees the open comment, replies, fixes (a new version) and resolves it.
    const threads = (await designer.get(v(id, '/comments?version=1')).expect(200)).body.threads;
    expect(threads).to.have.length(1);
    expect(threads[0]).to.include({ element: 'P1', resolved: false });
    await designer.post(v(id, '/comments'), { version: 1, parentId: pin.body.id, body: 'Heavier class in version 2' }).expect(201);
    await designer.put(v(id, '/network'), { version: 1, document: { ...SMALL_NETWORK, links: [{ ...SMALL_NETWORK.links[0], rating_m: 140 }] } }).expect(200);
    await designer.patch(v(id, `/comments/${pin.body.id}`), { resolved: true }).expect(200);
    await designer.post(v(id, '/versions/2/submit'), {}).expect(200);
    await reviewer.post(v(id, '/versions/2/approve'), { note: 'Good' }).expect(200, { version: 2, status: 'approved' });
    box = await mails();
    const approved = box.find((m) => m.to === 'designer@runnel.test' && m.subject.includes('version 2 approved'))!;
    expect(approved.text).to.include(`http://runnel.test/projects/${id}/review?version=2`);
    // The link opens the app at that version (the client route answers with index.html or the API serves the version).
    await designer.get(v(id, '/versions/2')).expect(200);

    const thread = (await designer.get(v(id, '/comments')).expect(200)).body.threads[0];
    expect(thread.replies.map((r: { body: string }) => r.body)).to.deep.equal(['Heavier class in version 2']);
    expect(thread).to.include({ resolved: true, resolvedBy: 'Dana Designer' });

    const actions = (await t.db.select().from(auditLog).where(eq(auditLog.target, id))).map((a) => a.action);
    for (const a of ['review.submit', 'review.comment', 'review.return', 'review.reply', 'review.resolve', 'review.approve']) expect(actions, a).to.include(a);
  });

  it('an approved version is frozen: decisions, resubmission and new pins are refused with 409 naming it; edits make a new version', async () => {
    const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
    const designer = await t.signInAs('designer');
    const reviewer = await t.signInAs('reviewer');
    await designer.post(v(id, '/versions/1/submit'), {}).expect(200);
    await reviewer.post(v(id, '/versions/1/approve'), {}).expect(200);
    for (const [who, path, body] of [
      [reviewer, '/versions/1/return', { note: 'no' }],
      [reviewer, '/versions/1/approve', {}],
      [designer, '/versions/1/submit', {}],
    ] as const) {
      const res = await who.post(v(id, path), body).expect(409);
      expect(res.body.error.message).to.equal('Version 1 is approved and frozen: it cannot change. Edit the network to make a new version and submit that.');
    }
    const pin = await reviewer.post(v(id, '/comments'), { version: 1, element: 'P1', body: 'late' }).expect(409);
    expect(pin.body.error.message).to.match(/Version 1 is approved and frozen/);
    const saved = await designer.put(v(id, '/network'), { version: 1, document: { ...SMALL_NETWORK, title: 'after approval' } }).expect(200);
    expect(saved.body.version).to.equal(2);
    expect(await status(id, 1)).to.equal('approved');
    expect(await status(id, 2)).to.equal('draft');
    const rows = await t.db.select().from(networkVersions).where(eq(networkVersions.projectId, id));
    expect(rows.find((r) => r.version === 1)!.document).to.deep.equal(SMALL_NETWORK);
  });

  it('bad transitions: approving a draft, returning without a note, submitting a stale version, approving your own submission', async () => {
    const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
    const designer = await t.signInAs('designer');
    const reviewer = await t.signInAs('reviewer');
    const draft = await reviewer.post(v(id, '/versions/1/approve'), {}).expect(409);
    expect(draft.body.error.message).to.equal('Version 1 is draft, not submitted: only a submitted version can be approved');
    expect(draft.body.error.fields[0].path).to.equal('version');
    await designer.post(v(id, '/versions/1/submit'), {}).expect(200);
    const noNote = await reviewer.post(v(id, '/versions/1/return'), { note: '  ' }).expect(400);
    expect(noNote.body.error.fields[0].path).to.equal('note');
    expect(await status(id, 1)).to.equal('submitted');
    await designer.put(v(id, '/network'), { version: 1, document: { ...SMALL_NETWORK, title: 'v2' } }).expect(200);
    await designer.put(v(id, '/network'), { version: 2, document: { ...SMALL_NETWORK, title: 'v3' } }).expect(200);
    const stale = await designer.post(v(id, '/versions/2/submit'), {}).expect(409);
    expect(stale.body.error.message).to.equal('Version 2 is not the latest (version 3 is); submit the latest version');
    await reviewer.post(v(id, '/versions/99/approve'), {}).expect(404);
    await reviewer.post(v(id, '/versions/x/approve'), {}).expect(400);
    // A member holding both roles cannot approve what they submitted: a second person must.
    const reviewerRow = await demoUserRow(t.db, 'reviewer');
    await t.db
      .update(memberships)
      .set({ roles: ['reviewer', 'designer'] })
      .where(eq(memberships.userId, reviewerRow.id));
    try {
      await reviewer.post(v(id, '/versions/3/submit'), {}).expect(200);
      const own = await reviewer.post(v(id, '/versions/3/approve'), {}).expect(403);
      expect(own.body.error.message).to.equal('You submitted version 3; a second person must approve it');
      expect(await status(id, 3)).to.equal('submitted');
    } finally {
      await t.db
        .update(memberships)
        .set({ roles: ['reviewer'] })
        .where(eq(memberships.userId, reviewerRow.id));
    }
  });

  it('comments: unknown element, missing pin, half a point, unknown parent → 400 naming the field; nothing written', async () => {
    const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
    const owner = await t.signInAs('owner');
    const cases: [Record<string, unknown>, string][] = [
      [{ version: 1, element: 'NOPE', body: 'x' }, 'element'],
      [{ version: 1, body: 'x' }, 'element'],
      [{ version: 1, x_m: 3, body: 'x' }, 'y_m'],
      [{ version: 1, element: 'P1', body: '' }, 'body'],
      [{ version: 1, parentId: '00000000-0000-4000-8000-000000000000', body: 'x' }, 'parentId'],
    ];
    for (const [body, field] of cases) {
      const res = await owner.post(v(id, '/comments'), body).expect(400);
      expect(res.body.error.fields[0].path, JSON.stringify(body)).to.equal(field);
    }
    await owner.post(v(id, '/comments'), { version: 7, element: 'P1', body: 'x' }).expect(404);
    expect(await t.db.select().from(reviewComments).where(eq(reviewComments.projectId, id))).to.deep.equal([]);
    // A point on the plan is a valid pin; the owner may comment but never approve.
    await owner.post(v(id, '/comments'), { version: 1, x_m: 12.5, y_m: -3, body: 'Is the trough here?' }).expect(201);
    await owner.post(v(id, '/versions/1/approve'), {}).expect(403);
    await (await t.signInAs('estimator')).post(v(id, '/comments'), { version: 1, element: 'P1', body: 'x' }).expect(403);
    await (await t.signInAs('other')).get(v(id, '/comments')).expect(404);
  });
});
