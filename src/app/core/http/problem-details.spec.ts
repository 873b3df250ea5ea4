import { HttpErrorResponse } from '@angular/common/http';

import { toProblem } from './problem-details';

describe('toProblem', () => {
  it('keeps the fields of an RFC 9457 body, including field errors', () => {
    const problem = toProblem(
      new HttpErrorResponse({
        status: 400,
        error: {
          type: 'https://qwell.test/problems/validation',
          title: 'Some fields are not valid',
          status: 400,
          detail: 'Email is missing.',
          errors: [{ field: 'email', message: 'Enter an email address.' }, { nonsense: true }],
        },
      }),
    );

    expect(problem).toEqual({
      type: 'https://qwell.test/problems/validation',
      title: 'Some fields are not valid',
      status: 400,
      detail: 'Email is missing.',
      errors: [{ field: 'email', message: 'Enter an email address.' }],
    });
  });

  it('gives a message a person can act on when the body is not a problem', () => {
    expect(toProblem(new HttpErrorResponse({ status: 502, error: '<html>Bad gateway</html>' })).detail).toMatch(
      /went wrong on the server/,
    );
    expect(toProblem(new HttpErrorResponse({ status: 423, error: null })).detail).toMatch(/locked/);
    expect(toProblem(new Error('boom')).status).toBe(0);
  });
});
