import { passwordSchema } from '../../../shared/auth/auth-api';
import { firstProblem } from './form-problem';

/** What is wrong with a new password typed twice, in words, or null when it will do. */
export function newPasswordProblem(password: string, repeated: string): string | null {
  const problem = firstProblem(passwordSchema, password);
  if (problem) return problem;
  return password === repeated ? null : 'The two passwords are not the same. Type the new password again in both fields.';
}
