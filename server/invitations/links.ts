/** The links e-mails carry; publicUrl is what officials' devices reach the server by. */
const base = (publicUrl: string) => publicUrl.replace(/\/+$/, '');

export const signInLink = (publicUrl: string) => `${base(publicUrl)}/sign-in`;
export const invitationLink = (publicUrl: string, token: string) => `${base(publicUrl)}/accept-invitation?token=${encodeURIComponent(token)}`;
export const passwordResetLink = (publicUrl: string, token: string) =>
  `${base(publicUrl)}/reset-password?token=${encodeURIComponent(token)}`;
