import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { summariseFieldProblems, toFieldProblems } from './field-problems';

describe('toFieldProblems', () => {
  it('when a nested field fails, then the problem names its dotted path', () => {
    const schema = z.object({ sled: z.object({ weightTenthsKg: z.number().int() }) });
    const result = schema.safeParse({ sled: { weightTenthsKg: 12.5 } });
    expect(result.success).toBe(false);
    const problems = toFieldProblems(result.error!, 'body');
    expect(problems).toHaveLength(1);
    expect(problems[0]!.field).toBe('sled.weightTenthsKg');
  });

  it('when the whole value is wrong, then the problem names where it came from', () => {
    const result = z.object({}).safeParse('not an object');
    expect(toFieldProblems(result.error!, 'query')[0]!.field).toBe('query');
  });
});

describe('summariseFieldProblems', () => {
  it('when there are several problems, then the first is spelled out and the rest counted', () => {
    const message = summariseFieldProblems([
      { field: 'trackType', message: 'choose natural or artificial' },
      { field: 'level', message: 'unknown level' },
      { field: 'venue', message: 'too long' },
    ]);
    expect(message).toBe('trackType: choose natural or artificial (and 2 more)');
  });

  it('when there is one problem, then nothing is counted', () => {
    expect(summariseFieldProblems([{ field: 'venue', message: 'too long' }])).toBe('venue: too long');
  });

  it('when there are none, then it still says something an official can read', () => {
    expect(summariseFieldProblems([])).toBe('The request could not be read.');
  });
});
