/**
 * The log is structured JSON and never holds a secret (issue 13 item 7): a failing query logs its
 * SQL but not its parameters (the password hash, the e-mail, whole documents) nor the database's
 * "Failing row contains (…)"; a sign-in logs neither the password, the session cookie nor the CSRF
 * token; an invitation link's token is masked in the request line.
 */
import { expect } from 'chai';
import { sql } from 'drizzle-orm';
import { sealSignup } from '../../server/auth/signup-token';
import { REDACTED, safeError, safePath } from '../../server/logging';
import { DEMO_PASSWORD } from '../../server/seed';
import { demoEmail, startTestApp, testConfig, type TestApp } from './test-app';

describe('API: structured logs without secrets', () => {
  let t: TestApp;
  const lines: string[] = [];
  const parsed = () => lines.map((l) => JSON.parse(l) as Record<string, unknown>);
  before(async () => {
    t = await startTestApp({ log: (line) => lines.push(line) });
  });
  after(async () => {
    await t.close();
  });
  beforeEach(() => {
    lines.length = 0;
  });

  it('every line is one JSON object with a level, a time and a message', async () => {
    await (await t.anonymous()).get('/api/projects');
    expect(lines.length).to.be.greaterThan(0);
    for (const line of parsed()) expect(line).to.include.keys('level', 'time', 'msg');
    const request = parsed().find((l) => (l.req as { path?: string } | undefined)?.path === '/api/projects')!;
    expect(request.res).to.deep.equal({ statusCode: 401 });
    expect(request).to.have.property('responseTime');
  });

  it('a failing query logs its SQL and SQLSTATE, never its parameters or the failing row', async () => {
    // A constraint the new account's insert will break: the 500 path with a password hash among the parameters.
    await t.db.execute(sql.raw(`ALTER TABLE users ADD CONSTRAINT log_spec_no_boom CHECK (name <> 'Boom Secretname')`));
    try {
      const a = await t.anonymous();
      const email = 'leaky.address@runnel.test';
      const password = 'SecretPassword-0123';
      const token = sealSignup(testConfig('/x').sessionSecret, { email, name: 'Boom Secretname', teamName: 'Leak Farm' });
      const res = await a.post('/api/auth/signup/confirm', { token, password });
      expect(res.status).to.equal(500);
      const text = lines.join('\n');
      for (const secret of [email, password, 'Boom Secretname', token, 'Failing row']) {
        expect(text, `log holds ${secret}`).to.not.include(secret);
      }
      // nor the bcrypt hash made of the password (random salt: any hash-shaped text)
      expect(text).to.not.match(/\$2[aby]\$\d\d\$/);
      const error = parsed().find((l) => l.msg === 'unexpected error')!;
      expect(error.level).to.equal(50);
      const err = error.err as { message: string; query?: string; cause?: { code?: string } };
      expect(err.query).to.match(/insert into "users"/);
      expect(err.message).to.include(`params: ${REDACTED}`);
      expect(err.cause?.code).to.equal('23514');
    } finally {
      await t.db.execute(sql.raw('ALTER TABLE users DROP CONSTRAINT log_spec_no_boom'));
    }
  });

  it('a sign-in logs neither the password, the session cookie nor the CSRF token', async () => {
    const a = await t.signIn(demoEmail('designer'), DEMO_PASSWORD);
    await a.get('/api/projects').expect(200);
    const sid = decodeURIComponent(a.sessionCookie.split('=')[1]);
    expect(sid.length).to.be.greaterThan(10);
    const text = lines.join('\n');
    for (const secret of [DEMO_PASSWORD, sid, sid.slice(2, 30), a.token]) expect(text).to.not.include(secret);
    expect(text).to.not.match(/set-cookie|runnel\.sid|x-csrf-token/i);
    const paths = parsed().map((l) => (l.req as { path?: string } | undefined)?.path);
    expect(paths).to.include.members(['/api/csrf', '/api/auth/signin', '/api/projects']);
  });

  it('an invitation token in the address is masked; a query string is dropped', async () => {
    const token = 'aVeryLongInvitationTokenValue_0123456789abcdef';
    await (await t.anonymous()).get(`/api/invitations/${token}?utm=secret-query`);
    const text = lines.join('\n');
    expect(text).to.not.include(token);
    expect(text).to.not.include('secret-query');
    expect(text).to.include(`/api/invitations/${REDACTED}`);
  });

  it('safePath keeps team invitation ids (UUIDs); safeError drops params, detail and quoted values', () => {
    const id = '0b7a4c1e-2f3d-4a5b-8c9d-0e1f2a3b4c5d';
    expect(safePath(`/api/team/invitations/${id}/resend`)).to.equal(`/api/team/invitations/${id}/resend`);
    const cause = Object.assign(new Error('invalid input syntax for type uuid: "hunter2-secret"'), {
      code: '22P02',
      detail: 'Failing row contains (hunter2)',
      where: 'x',
    });
    const err = Object.assign(new Error('Failed query: select 1 where id = $1\nparams: hunter2-secret'), {
      query: 'select 1 where id = $1',
      params: ['hunter2-secret'],
      cause,
    });
    const out = JSON.stringify(safeError(err));
    expect(out).to.not.include('hunter2');
    expect(out).to.include('select 1 where id = $1');
    expect(out).to.include('22P02');
    expect(JSON.stringify(safeError('a thrown string with a secret'))).to.not.include('secret');
  });
});
