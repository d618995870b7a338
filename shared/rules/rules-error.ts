/** Why the rules engine refused to judge: bad input or an incomplete profile, never a silent pass. */
export const rulesErrorCodes = [
  'missing-value',
  'missing-control-reading',
  'wrong-unit',
  'invalid-input',
  'profile-gap',
  'wrong-track-type',
] as const;
export type RulesErrorCode = (typeof rulesErrorCodes)[number];

export class RulesInputError extends Error {
  override readonly name = 'RulesInputError';

  constructor(
    readonly code: RulesErrorCode,
    message: string,
    readonly details: readonly string[] = [],
  ) {
    super(message);
  }
}
