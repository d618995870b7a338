import { describe, expect, it } from 'vitest';
import { acceptDemoValues } from '../rules/profile-values';
import { shippedProfile } from '../rules/shipped-profiles';
import { fieldDataSchema, type FieldData } from './field-data';
import { athletesOf, startListEntrySchema } from './start-list';

const competitionId = '0193a5c0-0000-7000-8000-0000000000a1';
const valid: FieldData = {
  competitionId,
  competition: {
    id: competitionId,
    name: 'Test Race',
    trackType: 'natural',
    level: 'national',
    venue: 'Test Road',
    firstRunOn: '2027-01-09',
    status: 'open',
  },
  profile: { competitionId, frozenAt: '2027-01-09T07:00:00.000Z', profile: acceptDemoValues(shippedProfile('natural', 'national')) },
  startList: [
    { bib: 1, startOrder: 1, discipline: 'singles-women', athlete: 'Ann Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
    { bib: 7, startOrder: 2, discipline: 'doubles', athlete: 'Bo Example', secondAthlete: 'Cy Example', officialBodyWeight: null, secondOfficialBodyWeight: null },
  ],
  instruments: [
    { id: '0193a5c0-0001-7000-8000-000000000101', label: 'PYR-01', purpose: 'control-steel-pyrometer', calibratedUntil: '2027-07-08', assignedTo: 'u1', nominalMass: null, certificateSha256: null },
  ],
  officials: [{ userId: 'u1', displayName: 'Test Official', role: 'official', area: 'start' }],
  fetchedAt: '2027-01-09T06:00:00.000Z',
};

describe('startListEntrySchema', () => {
  it('when a doubles sled names one athlete only, then it is refused in words', () => {
    const result = startListEntrySchema.safeParse({ bib: 7, startOrder: 2, discipline: 'doubles', athlete: 'Bo Example', secondAthlete: null });
    expect(result.error?.issues[0]?.message).toBe('A doubles sled has two athletes; a singles sled has one.');
  });

  it('when a singles sled names a second athlete, then it is refused', () => {
    expect(startListEntrySchema.safeParse({ ...valid.startList[0], secondAthlete: 'Someone Else' }).success).toBe(false);
  });

  it.each([['bib', 0], ['bib', 2.5], ['discipline', 'skeleton'], ['athlete', '']])('when %s is %j, then the entry is refused', (field, value) => {
    expect(startListEntrySchema.safeParse({ ...valid.startList[0], [field]: value }).success).toBe(false);
  });

  it('when the athletes are written on one line, then a doubles pair is joined by a slash', () => {
    expect(valid.startList.map(athletesOf)).toEqual(['Ann Example', 'Bo Example / Cy Example']);
  });
});

describe('fieldDataSchema', () => {
  it('when every part is well formed, then it parses unchanged', () => {
    expect(fieldDataSchema.parse(valid)).toEqual(valid);
  });

  it('when the competition has not opened, then the profile may be null', () => {
    expect(fieldDataSchema.safeParse({ ...valid, profile: null }).success).toBe(true);
  });

  it('when the summary or the profile belongs to another competition, then it is refused', () => {
    const other = '0193a5c0-0000-7000-8000-0000000000a2';
    expect(fieldDataSchema.safeParse({ ...valid, competition: { ...valid.competition, id: other } }).success).toBe(false);
    expect(fieldDataSchema.safeParse({ ...valid, profile: { ...valid.profile!, competitionId: other } }).success).toBe(false);
  });

  it('when an instrument has an unknown purpose, then the whole copy is refused', () => {
    const instruments = [{ ...valid.instruments[0]!, purpose: 'thermometer' }];
    expect(fieldDataSchema.safeParse({ ...valid, instruments }).success).toBe(false);
  });
});
