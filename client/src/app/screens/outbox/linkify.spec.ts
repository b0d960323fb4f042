import { expect } from 'chai';
import { linkify } from './linkify';

describe('linkify (outbox mail text)', () => {
  it('turns an invitation link on any host into an in-app link and keeps the text around it', () => {
    const parts = linkify('Open this link to accept:\nhttp://localhost:3000/join/abc_DEF-1.\nThanks');
    expect(parts).to.deep.equal([
      { kind: 'text', text: 'Open this link to accept:\n' },
      { kind: 'app-link', text: 'http://localhost:3000/join/abc_DEF-1', path: '/join/abc_DEF-1' },
      { kind: 'text', text: '.\nThanks' },
    ]);
  });
  it('keeps outside links as outside links', () => {
    expect(linkify('see https://example.test/help')).to.deep.equal([
      { kind: 'text', text: 'see ' },
      { kind: 'link', text: 'https://example.test/help', href: 'https://example.test/help' },
    ]);
  });
  it('never produces markup: angle brackets stay plain text', () => {
    const parts = linkify('<script>alert(1)</script>');
    expect(parts).to.deep.equal([{ kind: 'text', text: '<script>alert(1)</script>' }]);
  });
  it('returns nothing for empty text', () => {
    expect(linkify('')).to.deep.equal([]);
  });
});
