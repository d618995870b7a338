import { roleLabels, type RoleAssignment } from '../../../shared/auth/roles';

const areaLabels = { start: 'start', finish: 'finish' } as const;

/** One role in words, e.g. "Official, start" or "Organiser, all competitions". */
export function roleInWords(assignment: RoleAssignment): string {
  const label = roleLabels[assignment.role];
  if (assignment.area) return `${label}, ${areaLabels[assignment.area]}`;
  if (assignment.role === 'organiser' && assignment.competitionId === null) return `${label}, all competitions`;
  return label;
}

/** Every role a user holds, each named once, for the header. */
export function rolesInWords(assignments: readonly RoleAssignment[]): string {
  if (assignments.length === 0) return 'No role yet';
  return [...new Set(assignments.map(roleInWords))].join(' · ');
}
