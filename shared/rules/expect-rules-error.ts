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

/** The RulesInputError a call throws; any other error is a real failure and is rethrown. */
export function thrownBy(act: () => unknown): RulesInputError {
  try {
    act();
  } catch (error) {
    if (error instanceof RulesInputError) return error;
    throw error;
  }
  throw new Error('Expected a RulesInputError, but nothing was thrown.');
}

/** The code of the RulesInputError a call throws, or undefined when it throws nothing. */
export function errorCodeOf(act: () => unknown): string | undefined {
  try {
    act();
  } catch (error) {
    if (error instanceof RulesInputError) return error.code;
    throw error;
  }
  return undefined;
}
