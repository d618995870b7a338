import { authRoutes, type AuthRouteDeps } from './auth/auth-routes';
import type { ApiRoute } from './http/api-route';
import { invitationRoutes } from './invitations/invitation-routes';
import { passwordResetRoutes } from './invitations/password-reset-routes';
import type { PasswordResetLimits } from './invitations/reset-limits';
import { mailboxRoutes } from './mail/mailbox-routes';
import type { Mailer } from './mail/mailer';
import { competitionRoutes } from './routes/competitions';
import { fieldDataRoutes } from './routes/field-data';
import { healthRoutes } from './routes/health';
import { syncRoutes } from './sync/sync-routes';
import { uploadRoutes, type UploadSettings } from './uploads/upload-routes';

export interface ApiDeps extends AuthRouteDeps {
  mailer: Mailer;
  /** Base URL of this server as devices reach it, put in e-mailed links. */
  publicUrl: string;
  resetLimits: PasswordResetLimits;
  /** Where photos and certificates are kept; without it the upload routes answer 503. */
  uploads?: UploadSettings;
}

/** Every API route, each with the access it declares; the authorisation matrix test walks this list. */
export function apiRoutes(deps: ApiDeps): ApiRoute[] {
  return [
    ...healthRoutes(deps.db),
    ...competitionRoutes(deps.db),
    ...fieldDataRoutes(deps.db),
    ...authRoutes(deps),
    ...invitationRoutes(deps),
    ...passwordResetRoutes(deps),
    ...mailboxRoutes(deps.db),
    ...syncRoutes(deps.db),
    ...uploadRoutes(deps.db, deps.uploads),
  ];
}
