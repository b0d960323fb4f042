// The Angular packages are partially compiled; loading the JIT compiler lets Node import them.
import '@angular/compiler';
import { HttpErrorResponse } from '@angular/common/http';
import { expect } from 'chai';
import { apiErrorMessage } from './api-errors';

// The error body shape is the contract in server/API.md ("Errors always have this shape").
describe('apiErrorMessage', () => {
  it('shows the server message and one line per field error', () => {
    const err = new HttpErrorResponse({
      status: 400,
      error: { error: { code: 'validation', message: 'Invalid request body', fields: [{ path: 'name', message: 'Required' }] } },
    });
    expect(apiErrorMessage(err)).to.equal('Invalid request body\n• name: Required');
  });
  it('never shows an HTML or unknown body; says what happened instead', () => {
    expect(apiErrorMessage(new HttpErrorResponse({ status: 502, error: '<html>Bad gateway</html>' }))).to.match(/could not complete/);
    expect(apiErrorMessage(new HttpErrorResponse({ status: 0 }))).to.match(/Cannot reach/);
    expect(apiErrorMessage(new HttpErrorResponse({ status: 429, error: 'Too many' }))).to.match(/Too many attempts/);
  });
  it('falls back to a sentence for a non-HTTP error', () => {
    expect(apiErrorMessage(new Error('boom'))).to.equal('Something went wrong.');
  });
  it('uses the screen’s own sentence for an expected status, over the body', () => {
    const err = new HttpErrorResponse({ status: 401, error: { error: { code: 'auth', message: 'Invalid credentials' } } });
    expect(apiErrorMessage(err, { 401: 'Those do not match.' })).to.equal('Those do not match.');
    expect(apiErrorMessage(err, { 404: 'Not here.' })).to.equal('Invalid credentials');
  });
  it('unwraps an error carried as a cause (rxResource wrapping)', () => {
    const wrapped = new Error('Resource is currently in an error state', { cause: new HttpErrorResponse({ status: 404 }) });
    expect(apiErrorMessage(wrapped, { 404: 'Gone.' })).to.equal('Gone.');
  });
});
