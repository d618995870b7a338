import type { z } from 'zod';
import { summariseFieldProblems, toFieldProblems } from '../../shared/api/field-problems';
import { ApiError } from './api-error';

/** Parses one part of a request with its zod schema, or throws a 400 that names each bad field. */
export function parseInput<T extends z.ZodType>(
  schema: T,
  value: unknown,
  where: 'query' | 'body' | 'params',
): z.infer<T> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const problems = toFieldProblems(result.error, where);
  throw new ApiError('bad_request', summariseFieldProblems(problems), problems);
}
