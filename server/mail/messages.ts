import { roleLabels, type RoleAssignment } from '../../shared/auth/roles';

/** The words of one e-mail; plain text only, so it reads the same in every mail program. */
export interface MailContent {
  subject: string;
  text: string;
}

export interface InvitationMail {
  displayName: string;
  invitedBy: string;
  /** From describeAssignment(). */
  role: string;
  link: string;
  expiresAt: Date;
}

export interface RoleAddedMail {
  displayName: string;
  invitedBy: string;
  role: string;
  signInUrl: string;
}

export interface PasswordResetMail {
  displayName: string;
  link: string;
}

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeStyle: 'short', timeZone: 'UTC' });
/** Officials read mail in many places; UTC, said out loud, is the one time nobody misreads. */
const inUtc = (moment: Date) => `${dateFormat.format(moment)} UTC`;

/** "Official at the start of Frostbarrow Night Sprint", or "Organiser of every competition". */
export function describeAssignment(assignment: RoleAssignment, competitionName: string | null): string {
  const role = roleLabels[assignment.role];
  if (assignment.competitionId === null) return `${role} of every competition`;
  const competition = competitionName ?? 'a competition';
  return assignment.area ? `${role} at the ${assignment.area} of ${competition}` : `${role} of ${competition}`;
}

export function invitationMail({ displayName, invitedBy, role, link, expiresAt }: InvitationMail): MailContent {
  return {
    subject: 'You are invited to Rimelog',
    text: [
      `Hello ${displayName},`,
      '',
      `${invitedBy} has invited you to Rimelog, the inspection log of the race officials, as:`,
      '',
      `    ${role}`,
      '',
      'To accept, open this link and choose your password:',
      '',
      link,
      '',
      `The link works once, until ${inUtc(expiresAt)}. If it has run out, ask ${invitedBy} for a new invitation.`,
      '',
      'If you did not expect this invitation, you can ignore this mail: nothing happens until the link is used.',
      '',
      'Rimelog',
    ].join('\n'),
  };
}

export function roleAddedMail({ displayName, invitedBy, role, signInUrl }: RoleAddedMail): MailContent {
  return {
    subject: 'Your Rimelog account has a new role',
    text: [
      `Hello ${displayName},`,
      '',
      `${invitedBy} has given your Rimelog account a new role:`,
      '',
      `    ${role}`,
      '',
      'Sign in as usual with your e-mail address and password; the new role shows the next time the app is online:',
      '',
      signInUrl,
      '',
      `If you did not expect this, tell ${invitedBy}.`,
      '',
      'Rimelog',
    ].join('\n'),
  };
}

export function passwordResetMail({ displayName, link }: PasswordResetMail): MailContent {
  return {
    subject: 'Reset your Rimelog password',
    text: [
      `Hello ${displayName},`,
      '',
      'Someone, we hope you, asked to reset the password of your Rimelog account. To choose a new password, open this link:',
      '',
      link,
      '',
      'The link works once, for one hour. A new password signs you out on every device, and the PINs for',
      'switching on shared devices are removed: set them again after you sign in.',
      '',
      'If you did not ask for this, ignore this mail; your password stays as it is.',
      '',
      'Rimelog',
    ].join('\n'),
  };
}
