import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Request } from 'express';
import { acceptInvitationRequestSchema, invitationRequestSchema } from '../../shared/auth/auth-api';
import { competitionRole, publicAccess } from '../auth/access';
import { hashToken, newOneTimeToken } from '../auth/one-time-tokens';
import { hashSecret } from '../auth/passwords';
import { requireAuth } from '../auth/request-auth';
import { grantRole } from '../auth/role-store';
import { generateUserId } from '../auth/user-ids';
import type { Database } from '../db/client';
import { competitions, invitations, roleAssignments, users } from '../db/schema';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';
import type { Mailer } from '../mail/mailer';
import { describeAssignment } from '../mail/messages';
import { invitationLink, signInLink } from './links';

export interface InvitationRouteDeps {
  db: Database;
  mailer: Mailer;
  publicUrl: string;
}

export const invitationLifetimeMs = 7 * 24 * 60 * 60 * 1000;

const isRecord = (value: unknown): value is Record<string, unknown> => typeof value === 'object' && value !== null;

/**
 * The competition the invitation is for. Anything but an id counts as "every competition", the
 * strictest check (only global organisers pass); input validation then says what is wrong.
 */
export function invitedCompetitionId(req: Request): string | null {
  const body: unknown = req.body;
  const assignment = isRecord(body) ? body['assignment'] : undefined;
  const competitionId = isRecord(assignment) ? assignment['competitionId'] : undefined;
  return typeof competitionId === 'string' ? competitionId : null;
}

export const invitationNotValid = () =>
  new ApiError(
    'bad_request',
    'This invitation link does not work any more: it was already used, it has run out, or it was not copied whole. Ask the organiser for a new invitation.',
    [{ field: 'token', message: 'ask the organiser for a new invitation' }],
  );

const mailNotSent = () =>
  new ApiError('unavailable', 'The e-mail could not be sent, so nothing was changed. Check the mail settings and try again.');

async function competitionName(db: Database, competitionId: string | null): Promise<string | null> {
  if (competitionId === null) return null;
  const [competition] = await db.select({ name: competitions.name }).from(competitions).where(eq(competitions.id, competitionId));
  if (!competition) {
    throw new ApiError('not_found', 'There is no competition with that id. Reload the list of competitions and choose again.');
  }
  return competition.name;
}

const stillValid = (tokenHash: string) =>
  and(eq(invitations.tokenHash, tokenHash), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date()));

export function invitationRoutes({ db, mailer, publicUrl }: InvitationRouteDeps): ApiRoute[] {
  return [
    {
      method: 'post',
      path: '/invitations',
      access: competitionRole(['organiser'], invitedCompetitionId),
      handle: async (req, res) => {
        const input = parseInput(invitationRequestSchema, req.body, 'body');
        const { user: organiser } = requireAuth(res);
        const role = describeAssignment(input.assignment, await competitionName(db, input.assignment.competitionId));
        const expiresAt = new Date(Date.now() + invitationLifetimeMs);
        const [existing] = await db
          .select({ id: users.id, displayName: users.displayName })
          .from(users)
          .where(eq(users.email, input.email));
        // The organiser gets the same answer either way, so inviting does not tell who has an account.
        if (existing) {
          await mailer
            .sendRoleAdded(input.email, {
              displayName: existing.displayName,
              invitedBy: organiser.displayName,
              role,
              signInUrl: signInLink(publicUrl),
            })
            .catch((error: unknown) => {
              req.log.error({ err: error }, 'a role mail could not be sent');
              throw mailNotSent();
            });
          await grantRole(db, existing.id, input.assignment);
        } else {
          const { token, tokenHash } = newOneTimeToken();
          await db.insert(invitations).values({
            tokenHash,
            email: input.email,
            displayName: input.displayName,
            assignment: input.assignment,
            invitedBy: organiser.id,
            expiresAt,
          });
          await mailer
            .sendInvitation(input.email, {
              displayName: input.displayName,
              invitedBy: organiser.displayName,
              role,
              link: invitationLink(publicUrl, token),
              expiresAt,
            })
            .catch(async (error: unknown) => {
              req.log.error({ err: error }, 'an invitation mail could not be sent');
              await db.delete(invitations).where(eq(invitations.tokenHash, tokenHash));
              throw mailNotSent();
            });
        }
        res.status(201).json({ expiresAt: expiresAt.toISOString() });
      },
    },
    {
      method: 'post',
      path: '/invitations/accept',
      access: publicAccess,
      handle: async (req, res) => {
        const input = parseInput(acceptInvitationRequestSchema, req.body, 'body');
        const tokenHash = hashToken(input.token);
        const [invitation] = await db.select({ email: invitations.email }).from(invitations).where(stillValid(tokenHash));
        if (!invitation) throw invitationNotValid();
        const passwordHash = await hashSecret(input.password);
        const outcome = await db.transaction(async (tx) => {
          // Claiming the invitation in the same statement that checks it: two clicks cannot both use it.
          const [claimed] = await tx.update(invitations).set({ acceptedAt: new Date() }).where(stillValid(tokenHash)).returning();
          if (!claimed) return undefined;
          const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, claimed.email));
          const userId = existing?.id ?? generateUserId();
          if (!existing) {
            await tx.insert(users).values({ id: userId, email: claimed.email, displayName: claimed.displayName, passwordHash });
          }
          const { role, competitionId, area } = claimed.assignment;
          await tx.insert(roleAssignments).values({ userId, role, competitionId, area }).onConflictDoNothing();
          return { email: claimed.email, accountExisted: existing !== undefined };
        });
        if (!outcome) throw invitationNotValid();
        if (outcome.accountExisted) {
          // The account was made meanwhile (an earlier invitation); its password stays, the role is added.
          throw new ApiError(
            'conflict',
            'There is already an account for this e-mail address, and the role of this invitation is now added to it. Sign in with its password, or ask for a password reset.',
          );
        }
        res.status(201).json({ email: outcome.email });
      },
    },
  ];
}
