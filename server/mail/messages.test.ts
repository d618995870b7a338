import { describe, expect, it } from 'vitest';
import { describeAssignment, invitationMail, passwordResetMail } from './messages';

const raceId = '0193a5c0-0000-7000-8000-000000000001';

describe('describeAssignment', () => {
  it('when the role has an area, then the area and the competition are named', () => {
    expect(describeAssignment({ role: 'area-leader', competitionId: raceId, area: 'finish' }, 'Frostbarrow Night Sprint')).toBe(
      'Area leader at the finish of Frostbarrow Night Sprint',
    );
  });

  it('when the role has no area, then only the competition is named', () => {
    expect(describeAssignment({ role: 'technical-delegate', competitionId: raceId, area: null }, 'Frostbarrow Night Sprint')).toBe(
      'Technical delegate of Frostbarrow Night Sprint',
    );
  });

  it('when the organiser role has no competition, then it is for every competition', () => {
    expect(describeAssignment({ role: 'organiser', competitionId: null, area: null }, null)).toBe('Organiser of every competition');
  });
});

describe('mail texts', () => {
  it('when an invitation is written, then it carries the link on a line of its own and the end of its validity in UTC', () => {
    const link = 'https://hut.example.org/accept-invitation?token=abc_DEF-123';
    const { text } = invitationMail({
      displayName: 'Ada',
      invitedBy: 'Ilse',
      role: 'Official',
      link,
      expiresAt: new Date('2027-01-16T18:30:00Z'),
    });
    expect(text.split('\n')).toContain(link);
    expect(text).toContain('until 16 January 2027 at 18:30 UTC');
  });

  it('when a password reset is written, then it carries the link on a line of its own', () => {
    const link = 'https://hut.example.org/reset-password?token=xyz';
    expect(passwordResetMail({ displayName: 'Ada', link }).text.split('\n')).toContain(link);
  });
});
