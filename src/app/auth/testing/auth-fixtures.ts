import type { Me } from '../../../../shared/auth/auth-api';
import type { RoleAssignment } from '../../../../shared/auth/roles';

// Invented people and ids for the specs; nothing here is loaded by the app.

export const raceId = '0193a5c0-0000-7000-8000-0000000000a1';
export const otherRaceId = '0193a5c0-0000-7000-8000-0000000000a2';
export const testDeviceId = '5b0e6f0c-3c1d-4c4e-9d1a-2f6b8a7c9e01';

export const startOfficial: RoleAssignment = { role: 'official', competitionId: raceId, area: 'start' };
export const globalOrganiser: RoleAssignment = { role: 'organiser', competitionId: null, area: null };

export function meFor(id: string, displayName: string, roles: RoleAssignment[], sessionExpiresAt = '2099-01-01T12:00:00.000Z'): Me {
  return {
    user: { id, email: `${id}@example.test`, displayName },
    roles,
    deviceId: testDeviceId,
    sessionExpiresAt,
    hasPin: false,
  };
}

export const firstOfficial = meFor('official-one', 'First Official', [startOfficial]);
export const secondOfficial = meFor('official-two', 'Second Official', [startOfficial]);
export const organiser = meFor('organiser-one', 'Test Organiser', [globalOrganiser]);

export const apiError = (code: string, message: string) => ({ error: { code, message, details: [] } });
