import { HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { ApiProblem } from './api-problem';

describe('ApiProblem.from', () => {
  it('reads an application/problem+json body with field errors', () => {
    const problem = ApiProblem.from(
      new HttpErrorResponse({
        status: 400,
        headers: new HttpHeaders({ 'content-type': 'application/problem+json' }),
        error: { type: 'about:blank', title: 'Invalid request', status: 400, errors: [{ field: 'firstAdmin.email', message: 'must be an e-mail address' }] },
      }),
    );
    expect(problem.status).toBe(400);
    expect(problem.fieldErrors).toEqual([{ field: 'firstAdmin.email', message: 'must be an e-mail address' }]);
    expect(problem.summary).toBe('Invalid request: check the highlighted fields.');
  });

  it('keeps the problem’s extension members for the screen that acts on them', () => {
    const problem = ApiProblem.from(
      new HttpErrorResponse({ status: 409, error: { type: 'urn:ohmprint:problem:other-sample', title: 'A file names another sample', status: 409, problem: 'other-sample', namedCode: 'OP-8MJA-4T' } }),
    );
    expect(problem.members).toMatchObject({ problem: 'other-sample', namedCode: 'OP-8MJA-4T' });
    expect(ApiProblem.from(new Error('x')).members).toEqual({});
  });

  it('prefers the detail sentence when there is one', () => {
    const problem = ApiProblem.from(
      new HttpErrorResponse({ status: 403, error: { type: 'about:blank', title: 'Forbidden', status: 403, detail: 'This lab is suspended; contact the platform operator.' } }),
    );
    expect(problem.summary).toBe('This lab is suspended; contact the platform operator.');
  });

  it('explains a network failure instead of showing status 0', () => {
    const problem = ApiProblem.from(new HttpErrorResponse({ status: 0, error: new ProgressEvent('error') }));
    expect(problem.title).toBe('No connection');
    expect(problem.summary).toMatch(/could not be reached/);
  });

  it('gives a readable sentence for a body that is not a problem document', () => {
    const problem = ApiProblem.from(new HttpErrorResponse({ status: 502, statusText: 'Bad Gateway', error: '<html>proxy error</html>' }));
    expect(problem.title).toBe('Server error');
    expect(problem.summary).toBe('The server answered 502 Bad Gateway.');
  });
});
