import { safeReturnUrl } from './form-problem';
import { newPasswordProblem } from './new-password';

describe('safeReturnUrl', () => {
  it('when the return address is a page of this app, then sign-in goes back to it', () => {
    expect(safeReturnUrl('/competitions/abc/rules?x=1')).toBe('/competitions/abc/rules?x=1');
  });

  it('when the return address leads elsewhere or is missing, then sign-in goes home', () => {
    const elsewhere = ['https://elsewhere.example/', '//elsewhere.example/', '/\\elsewhere.example', 'javascript:alert(1)'];
    for (const url of [...elsewhere, '', undefined, '/sign-in?returnUrl=%2F']) {
      expect(safeReturnUrl(url), String(url)).toBe('/');
    }
  });
});

describe('newPasswordProblem', () => {
  it('when the password is short, then the shared rule says how long it must be', () => {
    expect(newPasswordProblem('short', 'short')).toContain('at least 10 characters');
  });

  it('when the two passwords differ, then it says so', () => {
    expect(newPasswordProblem('cold fingers on the sled', 'cold fingers on the sed')).toContain('not the same');
  });

  it('when both are long enough and the same, then there is no problem', () => {
    expect(newPasswordProblem('cold fingers on the sled', 'cold fingers on the sled')).toBeNull();
  });
});
