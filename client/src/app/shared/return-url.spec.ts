import { expect } from 'chai';
import { safeReturnUrl } from './return-url';

// Open-redirect guard: only same-site paths are followed after sign-in (common web practice, OWASP
// "Unvalidated Redirects and Forwards" cheat sheet, from memory).
describe('safeReturnUrl', () => {
  it('keeps a same-site path', () => {
    expect(safeReturnUrl('/projects/abc/layout')).to.equal('/projects/abc/layout');
    expect(safeReturnUrl('/join/tok')).to.equal('/join/tok');
  });
  it('falls back to /projects for empty, absolute, protocol-relative and sign-in paths', () => {
    for (const bad of [undefined, null, '', 'https://elsewhere.test/', '//elsewhere.test/x', '/sign-in', '/sign-up?x=1']) {
      expect(safeReturnUrl(bad)).to.equal('/projects');
    }
  });
});
