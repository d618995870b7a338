import { fieldDataSchema, type FieldData } from '../../../../../shared/competition/field-data';
import { acceptDemoValues } from '../../../../../shared/rules/profile-values';
import { shippedProfile } from '../../../../../shared/rules/shipped-profiles';

// Invented people, instruments and times for the tests; nothing here is loaded by the app.

/** A well-formed answer of GET /api/competitions/:id/field-data for `competitionId`. */
export function fieldDataFor(competitionId: string, fetchedAt = '2027-01-09T06:00:00.000Z'): FieldData {
  // Parsed, so fields the fixture leaves out take their defaults as they do in a server's answer.
  return fieldDataSchema.parse({
    competitionId,
    competition: {
      id: competitionId,
      name: 'Test Night Race',
      trackType: 'natural',
      level: 'national',
      venue: 'Test Forest Road',
      firstRunOn: '2027-01-09',
      status: 'open',
    },
    profile: { competitionId, frozenAt: '2027-01-09T05:00:00.000Z', profile: acceptDemoValues(shippedProfile('natural', 'national')) },
    startList: [
      { bib: 1, startOrder: 1, discipline: 'singles-women', athlete: 'Ann Example', secondAthlete: null },
      { bib: 2, startOrder: 2, discipline: 'singles-men', athlete: 'Bo Example', secondAthlete: null },
      { bib: 3, startOrder: 3, discipline: 'doubles', athlete: 'Cy Example', secondAthlete: 'Di Example' },
    ],
    instruments: [
      { id: '0190a7e2-0001-7000-8000-000000000101', label: 'PYR-01', purpose: 'control-steel-pyrometer', calibratedUntil: '2027-07-08', assignedTo: 'official-one', certificateSha256: null },
      { id: '0190a7e2-0001-7000-8000-000000000102', label: 'PYR-02', purpose: 'sled-pyrometer', calibratedUntil: '2027-07-08', assignedTo: 'official-one', certificateSha256: null },
    ],
    officials: [{ userId: 'official-one', displayName: 'First Official', role: 'official', area: 'start' }],
    fetchedAt,
  });
}
