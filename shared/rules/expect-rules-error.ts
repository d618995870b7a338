import { expect } from 'vitest';
import { RulesInputError, type RulesErrorCode } from './rules-error';

/** Asserts that the engine refuses with a RulesInputError of the given code; returns it for more checks. */
export function expectRulesError(run: () => unknown, code: RulesErrorCode): RulesInputError {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(RulesInputError);
    expect((error as RulesInputError).code).toBe(code);
    return error as RulesInputError;
  }
  return expect.unreachable(`expected a RulesInputError (${code})`);
}
