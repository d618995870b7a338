import type { z } from 'zod';
import type { FieldProblem } from './api-error';

/**
 * Turns a zod failure into one plain-words problem per field, so the answer names what to fix
 * ("trackType: choose natural or artificial") instead of dumping the validator's internals.
 */
export function toFieldProblems(error: z.ZodError, where: string): FieldProblem[] {
  return error.issues.map((issue) => ({
    field: issue.path.length > 0 ? issue.path.join('.') : where,
    message: issue.message,
  }));
}

/** One sentence that sums up the problems, for the `message` of an error answer. */
export function summariseFieldProblems(problems: readonly FieldProblem[]): string {
  if (problems.length === 0) return 'The request could not be read.';
  const first = problems[0]!;
  const more = problems.length > 1 ? ` (and ${problems.length - 1} more)` : '';
  return `${first.field}: ${first.message}${more}`;
}
