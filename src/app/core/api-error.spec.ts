import { HttpErrorResponse } from '@angular/common/http';

import { apiErrorMessage, apiFieldErrors, apiUnplacedMessage, fieldLabel } from './api-error';

function failure(status: number, body: unknown): HttpErrorResponse {
  return new HttpErrorResponse({ status, error: body, url: '/api/things' });
}

describe('apiErrorMessage', () => {
  it('when the body has a message and details, then both read as sentences', () => {
    const error = failure(400, {
      error: {
        code: 'invalid',
        message: 'Check the list.',
        details: [
          { field: 'email', message: 'Not an e-mail address' },
          { line: 12, message: 'Price is missing.' },
          { message: 'Two columns share one name' },
        ],
      },
    });
    expect(apiErrorMessage(error)).toBe(
      'Check the list. Email: Not an e-mail address. Line 12: Price is missing. Two columns share one name.',
    );
  });

  it('when a validation error repeats its first detail with the raw path, then it reads once, in words', () => {
    const error = failure(400, {
      error: {
        code: 'invalid',
        message: 'lines.0.quantity: must be at least 1',
        details: [{ field: 'lines.0.quantity', message: 'must be at least 1' }],
      },
    });
    expect(apiErrorMessage(error)).toBe('Quantity on line 1 must be at least 1.');
  });

  it('when two details say the same, then the sentence is said once', () => {
    const error = failure(400, {
      error: {
        code: 'invalid',
        message: 'skirt: not a length',
        details: [
          { field: 'skirt', message: 'not a length' },
          { field: 'skirt', message: 'not a length' },
        ],
      },
    });
    expect(apiErrorMessage(error)).toBe('Skirt not a length.');
    expect(apiErrorMessage(error, { skirt: 'Skirt diameter' })).toBe(
      'Skirt diameter not a length.',
    );
  });

  it('when the server cannot be reached, then it says so', () => {
    expect(apiErrorMessage(failure(0, new ProgressEvent('error')))).toMatch(/could not be reached/);
  });

  it('when a 5xx has no JSON body, then the status is named', () => {
    expect(apiErrorMessage(failure(502, '<html>Bad gateway</html>'))).toMatch(/error 502/);
  });

  it('when the body is not our error shape, then the status is named', () => {
    expect(apiErrorMessage(failure(404, { message: 'nope' }))).toMatch(/error 404/);
  });

  it('when it is not an HTTP failure, then the error message is used', () => {
    expect(apiErrorMessage(new Error('Disk full'))).toBe('Disk full');
    expect(apiErrorMessage('weird')).toBe('Something went wrong. Try again.');
  });
});

describe('apiFieldErrors', () => {
  it('when details name fields, then the first message per field is kept and lines are skipped', () => {
    const error = failure(400, {
      error: {
        code: 'invalid',
        message: 'Check the form.',
        details: [
          { field: 'email', message: 'Already in use' },
          { field: 'email', message: 'second message' },
          { line: 3, message: 'not a field' },
          { field: 'name', message: 'Required' },
        ],
      },
    });
    expect(apiFieldErrors(error)).toEqual({ email: 'Already in use.', name: 'Required.' });
  });

  it('when there is no error body, then there are no field errors', () => {
    expect(apiFieldErrors(failure(500, null))).toEqual({});
  });
});

describe('fieldLabel', () => {
  it('when a path has an index, then the line is counted from one', () => {
    expect(fieldLabel('maxCutPerPass')).toBe('Max cut per pass');
    expect(fieldLabel('lines.2.unitPrice')).toBe('Unit price on line 3');
    expect(fieldLabel('lines.2.unitPrice', { 'lines.*.unitPrice': 'Price' })).toBe(
      'Price on line 3',
    );
  });
});

describe('apiUnplacedMessage', () => {
  it('when every field error sits at its field, then only a short pointer is left', () => {
    const error = failure(400, {
      error: {
        code: 'invalid',
        message: 'timeZone: unknown time zone',
        details: [{ field: 'timeZone', message: 'unknown time zone' }],
      },
    });
    expect(apiUnplacedMessage(error, () => true)).toBe('Check the marked fields.');
    expect(apiUnplacedMessage(error, () => false)).toBe('Time zone unknown time zone.');
  });
});
