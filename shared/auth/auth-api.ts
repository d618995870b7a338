import { z } from 'zod';
import { roleAssignmentSchema } from './roles';

const email = z.email('Enter a valid e-mail address, like name@example.org.').max(254).transform((e) => e.toLowerCase());
/** Length is what makes a password strong; no composition rules (NIST SP 800-63B). */
export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters; a few words in a row are easy to type with cold fingers.')
  .max(128, 'Use at most 128 characters.');
export const pinSchema = z.string().regex(/^\d{4,6}$/, 'A PIN is 4 to 6 digits.');

/** `POST /api/auth/sign-in` */
export const signInRequestSchema = z.strictObject({
  email,
  password: z.string().min(1, 'Enter your password.').max(128),
  /** Stable id of this device, made on first use and kept in the browser. */
  deviceId: z.uuid(),
});
export type SignInRequest = z.input<typeof signInRequestSchema>;

export const userSchema = z.object({
  id: z.string(),
  email: z.string(),
  displayName: z.string(),
});
export type AuthUser = z.infer<typeof userSchema>;

/** `GET /api/auth/me` and the answer to sign-in and switch. */
export const meSchema = z.object({
  user: userSchema,
  roles: z.array(roleAssignmentSchema),
  deviceId: z.uuid(),
  sessionExpiresAt: z.iso.datetime({ offset: true }),
  hasPin: z.boolean(),
});
export type Me = z.infer<typeof meSchema>;

/** `POST /api/auth/pin`: set or change the PIN for switching on this device (needs the password again). */
export const setPinRequestSchema = z.strictObject({ password: z.string().min(1).max(128), pin: pinSchema });

/** `POST /api/auth/switch`: another official who signed in on this device takes over with their PIN. */
export const switchRequestSchema = z.strictObject({ userId: z.string().min(1).max(64), pin: pinSchema });

/** `POST /api/invitations` (organiser) */
export const invitationRequestSchema = z.strictObject({
  email,
  displayName: z.string().trim().min(1, 'Enter the name to greet them by.').max(80),
  assignment: roleAssignmentSchema,
});
export type InvitationRequest = z.input<typeof invitationRequestSchema>;

/** `POST /api/invitations/accept` */
export const acceptInvitationRequestSchema = z.strictObject({
  token: z.string().min(20).max(200),
  password: passwordSchema,
});

/** `POST /api/auth/password-reset` and `POST /api/auth/password-reset/confirm` */
export const passwordResetRequestSchema = z.strictObject({ email });
export const passwordResetConfirmSchema = z.strictObject({ token: z.string().min(20).max(200), password: passwordSchema });
