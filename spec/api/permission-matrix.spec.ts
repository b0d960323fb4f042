/**
 * ROLE × ROUTE: every /api route, called by every role (and by nobody), must answer exactly what
 * the permission table in server/permissions.ts decides: success for a role holding the route's
 * permission, 403 otherwise, 401 when signed out. The expectation is derived from PERMISSION_TABLE,
 * and the route list is checked against the routes the app registered, so a new route without a
 * case here fails this test.
 */
import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { expect } from 'chai';
import type { Response } from 'supertest';
import { walkPoints } from '../../drizzle/schema';
import { emptyBudget } from '../../engine/budget';
import { PERMISSION_TABLE, ROLES, type Access, type Role } from '../../server/permissions';
import { sealSignup } from '../../server/auth/signup-token';
import { DEMO_PASSWORD } from '../../server/seed';
import {
  insertFile,
  insertSurveyFile,
  insertInvitation,
  insertInvitationRow,
  insertMember,
  insertProject,
  insertComment,
  insertSavedProject,
  insertSubmittedProject,
  insertTeam,
  PNG_BYTES,
  SMALL_NETWORK,
  SURVEY_CSV,
} from './fixtures';
import { insertOption, insertPrice, PRICE_CSV } from './option-fixtures';
import { demoEmail, startTestApp, testConfig, type ApiAgent, type TestApp } from './test-app';

interface Case {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** Path relative to /api, as registered. */
  path: string;
  /** The access API.md documents for this route. */
  access: Access;
  success: 200 | 201 | 202 | 204;
  /** Sends the request; may create the target first. `who` is the signed-in role (null: signed out). */
  call(a: ApiAgent, t: TestApp, who: Role | null): PromiseLike<Response>;
}

const p = (t: TestApp) => `/api/projects/${t.seeded!.demoProjectId}`;

/** A walk with one track fix, written straight to the table; returns its id. */
async function insertWalk(t: TestApp): Promise<string> {
  const walkId = randomUUID();
  await t.db.insert(walkPoints).values({
    projectId: t.seeded!.demoProjectId,
    id: randomUUID(),
    walkId,
    type: 'track',
    recordedAt: new Date(),
    data: { lat: 45, lon: -120, accuracy_m: 4, elevation_m: null },
  });
  return walkId;
}

const CASES: Case[] = [
  { method: 'get', path: '/csrf', access: 'public', success: 200, call: (a) => a.get('/api/csrf') },
  {
    method: 'post',
    path: '/auth/signup',
    access: 'public',
    success: 202,
    call: (a) => a.post('/api/auth/signup', { email: `s-${randomUUID()}@example.test`, name: 'S', teamName: 'T' }),
  },
  {
    method: 'post',
    path: '/auth/signup/confirm',
    access: 'public',
    success: 201,
    call: (a) =>
      a.post('/api/auth/signup/confirm', {
        token: sealSignup(testConfig('/x').sessionSecret, { email: `c-${randomUUID()}@example.test`, name: 'C', teamName: 'T' }),
        password: 'long-enough-pw',
      }),
  },
  {
    method: 'post',
    path: '/auth/signin',
    access: 'public',
    success: 200,
    call: (a, _t, who) => a.post('/api/auth/signin', { email: demoEmail(who ?? 'owner'), password: DEMO_PASSWORD }),
  },
  { method: 'post', path: '/auth/signout', access: 'public', success: 204, call: (a) => a.post('/api/auth/signout') },
  { method: 'get', path: '/auth/me', access: 'signed-in', success: 200, call: (a) => a.get('/api/auth/me') },
  {
    method: 'post',
    path: '/auth/current-team',
    access: 'signed-in',
    success: 200,
    call: (a, t) => a.post('/api/auth/current-team', { teamId: t.seeded!.demoTeamId }),
  },
  { method: 'get', path: '/team', access: 'team.read', success: 200, call: (a) => a.get('/api/team') },
  { method: 'get', path: '/team/members', access: 'team.manage', success: 200, call: (a) => a.get('/api/team/members') },
  {
    method: 'patch',
    path: '/team/members/:userId',
    access: 'team.manage',
    success: 200,
    call: async (a, t) => a.patch(`/api/team/members/${await insertMember(t.db, t.seeded!.demoTeamId, ['owner'])}`, { roles: ['owner', 'estimator'] }),
  },
  {
    method: 'delete',
    path: '/team/members/:userId',
    access: 'team.manage',
    success: 204,
    call: async (a, t) => a.delete(`/api/team/members/${await insertMember(t.db, t.seeded!.demoTeamId, ['owner'])}`),
  },
  { method: 'get', path: '/team/invitations', access: 'team.manage', success: 200, call: (a) => a.get('/api/team/invitations') },
  {
    method: 'post',
    path: '/team/invitations',
    access: 'team.manage',
    success: 201,
    call: (a) => a.post('/api/team/invitations', { email: `inv-${randomUUID()}@example.test`, roles: ['owner'] }),
  },
  {
    method: 'delete',
    path: '/team/invitations/:invitationId',
    access: 'team.manage',
    success: 204,
    call: async (a, t) => a.delete(`/api/team/invitations/${(await insertInvitationRow(t.db, t.seeded!.demoTeamId, ['owner'])).id}`),
  },
  {
    method: 'post',
    path: '/team/invitations/:invitationId/resend',
    access: 'team.manage',
    success: 200,
    call: async (a, t) => a.post(`/api/team/invitations/${(await insertInvitationRow(t.db, t.seeded!.demoTeamId, ['owner'])).id}/resend`),
  },
  {
    method: 'get',
    path: '/invitations/:token',
    access: 'public',
    success: 200,
    call: async (a, t) => a.get(`/api/invitations/${await insertInvitation(t.db, t.seeded!.demoTeamId, ['owner'])}`),
  },
  {
    method: 'post',
    path: '/invitations/:token/accept',
    access: 'public',
    success: 200,
    // Addressed to the caller: only the invited address may accept (a new account when signed out).
    call: async (a, t, who) =>
      a.post(
        `/api/invitations/${await insertInvitation(t.db, await insertTeam(t.db), ['owner'], who ? demoEmail(who) : undefined)}/accept`,
        who ? {} : { name: 'Newly Invited', password: 'long-enough-pw' },
      ),
  },
  { method: 'get', path: '/team/outbox', access: 'outbox.read', success: 200, call: (a) => a.get('/api/team/outbox') },
  { method: 'get', path: '/team/audit', access: 'audit.read', success: 200, call: (a) => a.get('/api/team/audit') },
  { method: 'get', path: '/projects', access: 'project.read', success: 200, call: (a) => a.get('/api/projects') },
  { method: 'post', path: '/projects', access: 'project.create', success: 201, call: (a) => a.post('/api/projects', { name: 'Matrix project' }) },
  { method: 'get', path: '/projects/:id', access: 'project.read', success: 200, call: (a, t) => a.get(p(t)) },
  {
    method: 'patch',
    path: '/projects/:id',
    access: 'project.update',
    success: 200,
    call: async (a, t) => a.patch(`/api/projects/${await insertProject(t.db, t.seeded!.demoTeamId)}`, { notes: 'changed' }),
  },
  {
    method: 'delete',
    path: '/projects/:id',
    access: 'project.delete',
    success: 204,
    call: async (a, t) => a.delete(`/api/projects/${await insertProject(t.db, t.seeded!.demoTeamId)}`),
  },
  { method: 'get', path: '/projects/:id/network', access: 'network.read', success: 200, call: (a, t) => a.get(`${p(t)}/network`) },
  {
    method: 'put',
    path: '/projects/:id/network',
    access: 'network.write',
    success: 200,
    call: async (a, t) => a.put(`/api/projects/${await insertProject(t.db, t.seeded!.demoTeamId)}/network`, { version: 0, document: SMALL_NETWORK }),
  },
  { method: 'get', path: '/projects/:id/budget', access: 'budget.read', success: 200, call: (a, t) => a.get(`${p(t)}/budget`) },
  {
    method: 'put',
    path: '/projects/:id/budget',
    access: 'budget.write',
    success: 200,
    call: async (a, t) => a.put(`/api/projects/${await insertProject(t.db, t.seeded!.demoTeamId)}/budget`, { version: 0, document: emptyBudget() }),
  },
  { method: 'get', path: '/projects/:id/profile-settings', access: 'project.read', success: 200, call: (a, t) => a.get(`${p(t)}/profile-settings`) },
  {
    method: 'put',
    path: '/projects/:id/profile-settings',
    access: 'profile.write',
    success: 200,
    call: async (a, t) => a.put(`/api/projects/${await insertProject(t.db, t.seeded!.demoTeamId)}/profile-settings`, { cover_m: 0.6 }),
  },
  { method: 'get', path: '/projects/:id/versions', access: 'network.read', success: 200, call: (a, t) => a.get(`${p(t)}/versions`) },
  { method: 'get', path: '/projects/:id/versions/:version', access: 'network.read', success: 200, call: (a, t) => a.get(`${p(t)}/versions/1`) },
  {
    method: 'get',
    path: '/projects/:id/versions/:version/compare/:other',
    access: 'network.read',
    success: 200,
    call: (a, t) => a.get(`${p(t)}/versions/1/compare/1`),
  },
  {
    method: 'post',
    path: '/projects/:id/versions/:version/restore',
    access: 'network.write',
    success: 201,
    call: async (a, t) => a.post(`/api/projects/${await insertSavedProject(t.db, t.seeded!.demoTeamId)}/versions/1/restore`, { version: 1 }),
  },
  {
    method: 'post',
    path: '/projects/:id/versions/:version/submit',
    access: 'review.submit',
    success: 200,
    call: async (a, t) => a.post(`/api/projects/${await insertSavedProject(t.db, t.seeded!.demoTeamId)}/versions/1/submit`, {}),
  },
  {
    method: 'post',
    path: '/projects/:id/versions/:version/approve',
    access: 'review.decide',
    success: 200,
    call: async (a, t) => a.post(`/api/projects/${await insertSubmittedProject(t.db, t.seeded!.demoTeamId)}/versions/1/approve`, {}),
  },
  {
    method: 'post',
    path: '/projects/:id/versions/:version/return',
    access: 'review.decide',
    success: 200,
    call: async (a, t) => a.post(`/api/projects/${await insertSubmittedProject(t.db, t.seeded!.demoTeamId)}/versions/1/return`, { note: 'again' }),
  },
  { method: 'get', path: '/projects/:id/comments', access: 'review.read', success: 200, call: (a, t) => a.get(`${p(t)}/comments`) },
  {
    method: 'post',
    path: '/projects/:id/comments',
    access: 'review.comment',
    success: 201,
    call: (a, t) => a.post(`${p(t)}/comments`, { version: 1, element: 'TR4', body: 'Matrix comment' }),
  },
  {
    method: 'patch',
    path: '/projects/:id/comments/:commentId',
    access: 'review.comment',
    success: 200,
    call: async (a, t) => a.patch(`${p(t)}/comments/${await insertComment(t.db, t.seeded!.demoProjectId)}`, { resolved: true }),
  },
  { method: 'get', path: '/projects/:id/files', access: 'files.read', success: 200, call: (a, t) => a.get(`${p(t)}/files`) },
  {
    method: 'post',
    path: '/projects/:id/files',
    access: 'files.write',
    success: 201,
    call: (a, t) => a.upload(`${p(t)}/files`, { bytes: PNG_BYTES, filename: 'plan.png' }, { kind: 'backdrop' }),
  },
  {
    method: 'get',
    path: '/projects/:id/files/:fileId',
    access: 'files.read',
    success: 200,
    call: async (a, t) => a.get(`${p(t)}/files/${await insertFile(t.db, t.seeded!.demoProjectId)}`),
  },
  {
    method: 'patch',
    path: '/projects/:id/files/:fileId',
    access: 'files.write',
    success: 200,
    call: async (a, t) => a.patch(`${p(t)}/files/${await insertFile(t.db, t.seeded!.demoProjectId)}`, { filename: 'renamed' }),
  },
  {
    method: 'get',
    path: '/projects/:id/files/:fileId/points',
    access: 'files.read',
    success: 200,
    call: async (a, t) => a.get(`${p(t)}/files/${await insertSurveyFile(t.db, t.seeded!.demoProjectId)}/points`),
  },
  {
    method: 'delete',
    path: '/projects/:id/files/:fileId',
    access: 'files.write',
    success: 204,
    call: async (a, t) => a.delete(`${p(t)}/files/${await insertFile(t.db, t.seeded!.demoProjectId)}`),
  },
  {
    method: 'post',
    path: '/projects/:id/survey/parse',
    access: 'files.read',
    success: 200,
    call: (a, t) => a.upload(`${p(t)}/survey/parse`, { bytes: Buffer.from(SURVEY_CSV), filename: 'pegs.csv' }),
  },
  { method: 'get', path: '/prices', access: 'prices.read', success: 200, call: (a) => a.get('/api/prices') },
  {
    method: 'post',
    path: '/prices',
    access: 'prices.write',
    success: 201,
    call: (a) => a.post('/api/prices', { code: `other/m-${randomUUID().slice(0, 8)}`, description: 'Matrix item', unit: 'each', price: 2 }),
  },
  {
    method: 'patch',
    path: '/prices/:itemId',
    access: 'prices.write',
    success: 200,
    call: async (a, t) => a.patch(`/api/prices/${await insertPrice(t.db, t.seeded!.demoTeamId)}`, { price: 3.25 }),
  },
  {
    method: 'delete',
    path: '/prices/:itemId',
    access: 'prices.write',
    success: 204,
    call: async (a, t) => a.delete(`/api/prices/${await insertPrice(t.db, t.seeded!.demoTeamId)}`),
  },
  {
    method: 'post',
    path: '/prices/import',
    access: 'prices.write',
    success: 200,
    call: (a) => a.upload('/api/prices/import', { bytes: Buffer.from(PRICE_CSV), filename: 'prices.csv' }),
  },
  { method: 'get', path: '/projects/:id/options', access: 'options.read', success: 200, call: (a, t) => a.get(`${p(t)}/options`) },
  {
    method: 'get',
    path: '/projects/:id/options/:optionId',
    access: 'options.read',
    success: 200,
    call: async (a, t) => a.get(`${p(t)}/options/${await insertOption(t.db, t.seeded!.demoProjectId)}`),
  },
  {
    method: 'post',
    path: '/projects/:id/options',
    access: 'options.write',
    success: 201,
    call: async (a, t) => a.post(`/api/projects/${await insertSavedProject(t.db, t.seeded!.demoTeamId)}/options`, { name: 'Matrix option' }),
  },
  {
    method: 'patch',
    path: '/projects/:id/options/:optionId',
    access: 'options.write',
    success: 200,
    call: async (a, t) =>
      a.patch(`${p(t)}/options/${await insertOption(t.db, t.seeded!.demoProjectId)}`, {
        name: 'Renamed',
        pipes: [{ id: 'L-TR4', series: 'pe-sidr9', nominal: '1"' }],
      }),
  },
  {
    method: 'post',
    path: '/projects/:id/options/:optionId/size',
    access: 'options.write',
    success: 200,
    call: async (a, t) => a.post(`${p(t)}/options/${await insertOption(t.db, t.seeded!.demoProjectId)}/size`, { pipes: ['L-TR3', 'L-TR4'] }),
  },
  {
    method: 'post',
    path: '/projects/:id/options/:optionId/promote',
    access: 'options.write',
    success: 200,
    call: async (a, t) => {
      const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
      return a.post(`/api/projects/${id}/options/${await insertOption(t.db, id)}/promote`, {});
    },
  },
  {
    method: 'post',
    path: '/projects/:id/options/:optionId/prefer',
    access: 'options.prefer',
    success: 200,
    call: async (a, t) => {
      const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
      return a.post(`/api/projects/${id}/options/${await insertOption(t.db, id)}/prefer`);
    },
  },
  {
    method: 'delete',
    path: '/projects/:id/options/:optionId',
    access: 'options.write',
    success: 204,
    call: async (a, t) => a.delete(`${p(t)}/options/${await insertOption(t.db, t.seeded!.demoProjectId)}`),
  },
  { method: 'get', path: '/projects/:id/takeoff', access: 'takeoff.read', success: 200, call: (a, t) => a.get(`${p(t)}/takeoff`) },
  {
    method: 'put',
    path: '/projects/:id/takeoff/settings',
    access: 'takeoff.write',
    success: 200,
    call: async (a, t) =>
      a.put(`/api/projects/${await insertSavedProject(t.db, t.seeded!.demoTeamId)}/takeoff/settings`, {
        waste_fraction: 0.1,
        bendAngle_deg: 30,
        other: [],
        labour_hours: 4,
        labour_rate: 40,
        markup_fraction: 0.1,
        tax_fraction: 0.05,
        currency: 'USD',
      }),
  },
  {
    method: 'post',
    path: '/projects/:id/estimate/accept',
    access: 'estimate.accept',
    success: 201,
    call: async (a, t) => {
      const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
      const takeoff = await a.get(`/api/projects/${id}/takeoff`);
      return a.post(`/api/projects/${id}/estimate/accept`, { total: takeoff.body.estimate?.total ?? 0 });
    },
  },
  { method: 'get', path: '/projects/:id/takeoff.csv', access: 'takeoff.read', success: 200, call: (a, t) => a.get(`${p(t)}/takeoff.csv`) },
  { method: 'get', path: '/projects/:id/export.xlsx', access: 'takeoff.read', success: 200, call: (a, t) => a.get(`${p(t)}/export.xlsx`) },
  {
    method: 'put',
    path: '/projects/:id/walks/:walkId',
    access: 'files.write',
    success: 200,
    call: (a, t) => a.put(`${p(t)}/walks/${randomUUID()}`, { name: 'Matrix walk', points: [], track: [] }),
  },
  {
    method: 'get',
    path: '/projects/:id/walks/:walkId',
    access: 'files.read',
    success: 200,
    call: async (a, t) => a.get(`${p(t)}/walks/${await insertWalk(t)}`),
  },
  {
    method: 'put',
    path: '/projects/:id/walks/:walkId/photos/:photoId',
    access: 'files.write',
    success: 201,
    call: (a, t) =>
      a.agent
        .put(`${p(t)}/walks/${randomUUID()}/photos/${randomUUID()}`)
        .set('x-csrf-token', a.token)
        .attach('file', PNG_BYTES, { filename: 'peg.png', contentType: 'image/png' }),
  },
];

function expectedStatus(c: Case, who: Role | null): number {
  if (c.access === 'public') return c.success;
  if (who === null) return 401;
  if (c.access === 'signed-in') return c.success;
  const allowed: readonly Role[] = PERMISSION_TABLE[c.access];
  return allowed.includes(who) ? c.success : 403;
}

describe('API: role × route permission matrix', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it('covers every registered /api route, with the access API.md documents', () => {
    const registered = t.routes.map((r) => `${r.method} ${r.path} ${r.access}`).sort();
    const covered = CASES.map((c) => `${c.method} ${c.path} ${c.access}`).sort();
    expect(covered).to.deep.equal(registered);
  });

  for (const who of [...ROLES, null] as (Role | null)[]) {
    it(`${who ?? 'signed out'}: every route answers as the permission table says`, async () => {
      const outcomes: string[] = [];
      const mismatches: string[] = [];
      for (const c of CASES) {
        // A fresh agent per call: sign-out, sign-in and accept change the session.
        const agent = who ? await t.signInAs(who) : await t.anonymous();
        const res = await c.call(agent, t, who);
        const want = expectedStatus(c, who);
        outcomes.push(`${c.method.toUpperCase()} ${c.path} → ${res.status}`);
        if (res.status !== want) mismatches.push(`${c.method.toUpperCase()} ${c.path}: expected ${want}, got ${res.status} ${JSON.stringify(res.body)}`);
        if (res.status === 403) expect(res.body.error.code).to.equal('forbidden');
      }
      expect(mismatches, mismatches.join('\n')).to.deep.equal([]);
      expect(outcomes).to.have.length(CASES.length);
    });
  }

  it('the table itself matches API.md: every permission it names, reads for all, writes for the roles named there', () => {
    // the documented names (server/API.md, "Permission names") are exactly the table's
    const doc = readFileSync('server/API.md', 'utf8');
    const section = doc.slice(doc.indexOf('## Permission names'), doc.indexOf('Default table:'));
    const documented = [...section.matchAll(/`([a-z]+\.[a-z]+)`/g)].map((m) => m[1]);
    expect([...documented].sort()).to.deep.equal(Object.keys(PERMISSION_TABLE).sort());
    // the default table in API.md's words, typed here apart from server/permissions.ts
    const designers = ['admin', 'designer'];
    const expected: Record<string, string[]> = {
      ...Object.fromEntries(documented.filter((p) => p.endsWith('.read')).map((p) => [p, [...ROLES]])),
      ...Object.fromEntries(
        [
          'project.create',
          'project.update',
          'project.delete',
          'network.write',
          'budget.write',
          'profile.write',
          'files.write',
          'review.submit',
          'options.write',
        ].map((p) => [p, designers]),
      ),
      'team.manage': ['admin'],
      'outbox.read': ['admin'],
      'audit.read': ['admin'],
      'review.decide': ['reviewer'],
      'review.comment': ['admin', 'designer', 'reviewer', 'owner'],
      'prices.write': ['admin', 'estimator'],
      'takeoff.write': ['admin', 'estimator'],
      'options.prefer': ['owner'],
      'estimate.accept': ['owner'],
    };
    for (const [permission, roles] of Object.entries(PERMISSION_TABLE)) expect(roles, permission).to.have.members(expected[permission]);
  });

  it('is coherent: an admin holds every permission a designer holds', () => {
    const designer = Object.entries(PERMISSION_TABLE)
      .filter(([, roles]) => (roles as readonly Role[]).includes('designer'))
      .map(([p]) => p);
    const missing = designer.filter((p) => !(PERMISSION_TABLE[p as keyof typeof PERMISSION_TABLE] as readonly Role[]).includes('admin'));
    expect(missing, `admin lacks ${missing.join(', ')}`).to.deep.equal([]);
  });

  it('an admin who creates a project can draw in it and upload to it', async () => {
    const admin = await t.signInAs('admin');
    const project = await admin.post('/api/projects', { name: 'Admin draws' }).expect(201);
    await admin.put(`/api/projects/${project.body.id}/network`, { version: 0, document: SMALL_NETWORK }).expect(200);
    await admin.upload(`/api/projects/${project.body.id}/files`, { bytes: PNG_BYTES, filename: 'plan.png' }, { kind: 'backdrop' }).expect(201);
    const me = await admin.get('/api/auth/me').expect(200);
    expect(me.body.permissions).to.include.members(['project.create', 'network.write', 'files.write']);
  });
});
