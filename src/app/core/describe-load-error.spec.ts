import { HttpErrorResponse } from '@angular/common/http';
import { z } from 'zod';
import { describeLoadError } from './describe-load-error';

describe('describeLoadError', () => {
  it('when there is no connection, then it says the server cannot be reached', () => {
    expect(describeLoadError(new HttpErrorResponse({ status: 0 }))).toContain('cannot be reached');
  });

  it('when the server sends its error shape, then its message is shown as is', () => {
    const error = new HttpErrorResponse({
      status: 400,
      error: { error: { code: 'bad_request', message: 'trackType: choose natural or artificial', details: [] } },
    });
    expect(describeLoadError(error)).toBe('trackType: choose natural or artificial');
  });

  it('when the server fails without the error shape, then the status is named', () => {
    expect(describeLoadError(new HttpErrorResponse({ status: 502, error: '<html>' }))).toContain('(502)');
  });

  it('when the answer does not match the shared schema, then it asks for an app update', () => {
    const error = z.object({ id: z.string() }).safeParse({}).error;
    expect(describeLoadError(error)).toContain('Update the app');
  });
});
