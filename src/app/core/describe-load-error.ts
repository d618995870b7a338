import { HttpErrorResponse } from '@angular/common/http';
import { ZodError } from 'zod';
import { apiErrorBodySchema } from '../../../shared/api/api-error';

/** A failed server read, in words an official can act on. */
export function describeLoadError(error: unknown): string {
  if (error instanceof HttpErrorResponse) {
    if (error.status === 0) {
      return 'The server cannot be reached from this device right now. Try again when there is a signal.';
    }
    const body = apiErrorBodySchema.safeParse(error.error);
    if (body.success) return body.data.error.message;
    return `The server answered with an error (${error.status}). Try again shortly.`;
  }
  if (error instanceof ZodError) {
    return 'The server sent data this version of the app cannot read. Update the app at the hut.';
  }
  return 'Something went wrong while loading. Try again.';
}
