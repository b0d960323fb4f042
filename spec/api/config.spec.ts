import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { expect } from 'chai';
import { loadConfig } from '../../server/config';
import { makeTempDir, removeTempDir } from './test-app';

describe('server config (environment, validated once)', () => {
  let dir: string;
  beforeEach(() => {
    dir = makeTempDir('runnel-config-');
  });
  afterEach(() => {
    removeTempDir(dir);
  });

  it('defaults: port 3000, local mail sink, public URL from the port, insecure cookies outside production', () => {
    const c = loadConfig({ RUNNEL_DATA_DIR: dir });
    expect(c).to.include({ port: 3000, host: '127.0.0.1', dataDir: dir, publicUrl: 'http://localhost:3000', cookieSecure: false, production: false });
    expect(c.smtp).to.equal(undefined);
    expect(c.databaseUrl).to.equal(undefined);
  });

  it('generates a session secret once and keeps it in the data dir', () => {
    const first = loadConfig({ RUNNEL_DATA_DIR: dir });
    // 32 random bytes (256 bits) in base64url: ⌈32·8/6⌉ = 43 characters of A–Z a–z 0–9 - _ (RFC 4648 §5, C)
    expect(first.sessionSecret).to.match(/^[A-Za-z0-9_-]{43}$/);
    const other = makeTempDir('runnel-config-other-');
    expect(loadConfig({ RUNNEL_DATA_DIR: other }).sessionSecret).to.not.equal(first.sessionSecret);
    removeTempDir(other);
    expect(existsSync(join(dir, 'session-secret'))).to.equal(true);
    expect(loadConfig({ RUNNEL_DATA_DIR: dir }).sessionSecret).to.equal(first.sessionSecret);
    expect(readFileSync(join(dir, 'session-secret'), 'utf8').trim()).to.equal(first.sessionSecret);
  });

  it('production makes cookies Secure unless COOKIE_SECURE says otherwise', () => {
    expect(loadConfig({ RUNNEL_DATA_DIR: dir, NODE_ENV: 'production' }).cookieSecure).to.equal(true);
    expect(loadConfig({ RUNNEL_DATA_DIR: dir, NODE_ENV: 'production', COOKIE_SECURE: 'false' }).cookieSecure).to.equal(false);
  });

  it('reads SMTP, PUBLIC_URL (no trailing slash), DATABASE_URL and TRUST_PROXY', () => {
    const c = loadConfig({
      RUNNEL_DATA_DIR: dir,
      SMTP_HOST: 'mail.example.test',
      SMTP_PORT: '2525',
      SMTP_USER: 'u',
      SMTP_PASS: 'p',
      PUBLIC_URL: 'https://runnel.example.test/',
      DATABASE_URL: 'postgres://a@b/c',
      TRUST_PROXY: '1',
    });
    expect(c.smtp).to.deep.equal({ host: 'mail.example.test', port: 2525, user: 'u', pass: 'p' });
    expect(c.publicUrl).to.equal('https://runnel.example.test');
    expect(c.databaseUrl).to.equal('postgres://a@b/c');
    expect(c.trustProxy).to.equal(1);
  });

  it('refuses bad values with one message listing each variable', () => {
    expect(() => loadConfig({ RUNNEL_DATA_DIR: dir, PORT: 'eighty', DATABASE_URL: 'mysql://x', SESSION_SECRET: 'short' })).to.throw(
      /Invalid environment:[\s\S]*PORT[\s\S]*DATABASE_URL: must start with postgres:\/\/[\s\S]*SESSION_SECRET: must be at least 16/,
    );
  });

  it('TRUST_PROXY takes a hop count or a list of proxy addresses, and refuses true (a client would choose its IP)', () => {
    expect(loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: '2' }).trustProxy).to.equal(2);
    expect(loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: '10.0.0.5, 10.0.1.0/24,loopback,::1' }).trustProxy).to.deep.equal([
      '10.0.0.5',
      '10.0.1.0/24',
      'loopback',
      '::1',
    ]);
    expect(() => loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: 'true' })).to.throw(/TRUST_PROXY: must be a hop count[\s\S]*choose its own IP/);
    expect(() => loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: 'TRUE' })).to.throw(/TRUST_PROXY/);
    expect(() => loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: 'false' })).to.throw(/TRUST_PROXY/);
    expect(() => loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: '10.0.0.5,everyone' })).to.throw(/"everyone"/);
    expect(() => loadConfig({ RUNNEL_DATA_DIR: dir, TRUST_PROXY: '10.0.0.0/99' })).to.throw(/"10.0.0.0\/99"/);
  });
});
