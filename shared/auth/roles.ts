import { z } from 'zod';

/** Who may do what; a user can hold different roles in different competitions. */
export const roles = ['official', 'area-leader', 'technical-delegate', 'organiser'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
  official: 'Official',
  'area-leader': 'Area leader',
  'technical-delegate': 'Technical delegate',
  organiser: 'Organiser',
};

export const areas = ['start', 'finish'] as const;
export type Area = (typeof areas)[number];

/**
 * One role of one user. Officials and area leaders work in one area of one competition; a technical
 * delegate in one competition; an organiser either in one competition or, with no competition, in all.
 */
export const roleAssignmentSchema = z
  .strictObject({
    role: z.enum(roles),
    competitionId: z.uuid().nullable(),
    area: z.enum(areas).nullable(),
  })
  .refine((a) => (a.role === 'official' || a.role === 'area-leader' ? a.area !== null : a.area === null), {
    message: 'Officials and area leaders need an area (start or finish); other roles have none.',
    path: ['area'],
  })
  .refine((a) => a.role === 'organiser' || a.competitionId !== null, {
    message: 'Only an organiser may hold a role without a competition.',
    path: ['competitionId'],
  });
export type RoleAssignment = z.infer<typeof roleAssignmentSchema>;

/** The roles a user holds in one competition (global organiser roles count everywhere). */
export function rolesIn(assignments: readonly RoleAssignment[], competitionId: string): RoleAssignment[] {
  return assignments.filter((a) => a.competitionId === competitionId || (a.role === 'organiser' && a.competitionId === null));
}

export function hasRole(assignments: readonly RoleAssignment[], competitionId: string | null, ...wanted: Role[]): boolean {
  const relevant = competitionId === null ? assignments.filter((a) => a.competitionId === null) : rolesIn(assignments, competitionId);
  return relevant.some((a) => wanted.includes(a.role));
}
