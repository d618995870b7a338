import { eq, inArray } from 'drizzle-orm';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorBodySchema } from '../../shared/api/api-error';
import { fieldDataSchema, type FieldData } from '../../shared/competition/field-data';
import { instrumentRefusal } from '../../shared/competition/instruments';
import { competitionRulesProfileSchema } from '../../shared/rules/competition-profile';
import { instruments, startListEntries, users } from '../../server/db/schema';
import { demoCompetitions, demoInstruments, demoOpenCompetitionId, demoStartLists, seedDemoScenario } from '../../server/ops/demo-scenario';
import { demoUsers } from '../../server/ops/demo-users';
import { signInAs } from '../support/sign-in';
import { createTestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

let database: TestDatabase;
let app: Express;
let official: string;
let organiser: string;
const frostbarrow = demoCompetitions[0];
const glimmerdale = demoCompetitions[2];
const planned = demoCompetitions[1];
const fieldDataUrl = (id: string) => `/api/competitions/${id}/field-data`;

beforeAll(async () => {
  database = await createTestDatabase();
  await seedDemoScenario(database.db);
  app = createTestApp(database);
  official = await signInAs(app, 'start-official@frostbarrow.test');
  organiser = await signInAs(app, 'organiser@frostbarrow.test');
});
afterAll(() => database.drop());

async function fieldData(id: string, cookie = official): Promise<FieldData> {
  const response = await request(app).get(fieldDataUrl(id)).set('Cookie', cookie).expect(200);
  return fieldDataSchema.parse(response.body);
}

async function userIdsByEmail(): Promise<Map<string, string>> {
  const rows = await database.db.select({ id: users.id, email: users.email }).from(users).where(inArray(users.email, demoUsers.map((u) => u.email)));
  return new Map(rows.map((r) => [r.email, r.id]));
}

describe('GET /api/competitions/:id/field-data', () => {
  it('when a start official asks for the open natural race, then its start list comes in start order, doubles with both athletes', async () => {
    const body = await fieldData(frostbarrow.id);
    expect(body.competitionId).toBe(frostbarrow.id);
    expect(body.competition).toMatchObject({ name: 'Frostbarrow Night Sprint', trackType: 'natural', level: 'national', status: 'open' });
    expect(body.startList).toEqual(demoStartLists[frostbarrow.id]);
    expect(body.startList.map((e) => e.startOrder)).toEqual([...body.startList.map((e) => e.startOrder)].sort((a, b) => a - b));
    expect(new Set(body.startList.map((e) => e.discipline))).toEqual(new Set(['singles-women', 'singles-men', 'doubles']));
    for (const entry of body.startList) expect(entry.secondAthlete !== null).toBe(entry.discipline === 'doubles');
    expect(isUncached(await request(app).get(fieldDataUrl(frostbarrow.id)).set('Cookie', official))).toBe(true);
  });

  it('when the instruments come back, then each names the official it is issued to, sorted by label', async () => {
    const body = await fieldData(frostbarrow.id);
    const ids = await userIdsByEmail();
    const pim = ids.get('start-official@frostbarrow.test')!;
    const kaja = ids.get('start-official-2@frostbarrow.test')!;
    expect(body.instruments.map((i) => i.label)).toEqual(['ANG-01', 'CAL-01', 'CWT-01', 'GAP-01', 'PYR-01', 'PYR-02', 'PYR-03', 'PYR-04', 'RUL-01', 'SCL-01']);
    const byLabel = new Map(body.instruments.map((i) => [i.label, i]));
    expect(byLabel.get('PYR-01')).toMatchObject({ purpose: 'control-steel-pyrometer', assignedTo: pim, calibratedUntil: '2027-07-08' });
    expect(byLabel.get('PYR-02')).toMatchObject({ purpose: 'sled-pyrometer', assignedTo: pim });
    expect(byLabel.get('PYR-03')).toMatchObject({ purpose: 'sled-pyrometer', assignedTo: kaja });
    expect(body.instruments).toHaveLength(demoInstruments[frostbarrow.id]!.length);
  });

  it('when the demo official picks instruments on race day, then the app can refuse the expired, the wrong kind and another official’s', async () => {
    const body = await fieldData(frostbarrow.id);
    const pim = (await userIdsByEmail()).get('start-official@frostbarrow.test')!;
    const use = (label: string, purpose: 'control-steel-pyrometer' | 'sled-pyrometer') =>
      instrumentRefusal(body.instruments.find((i) => i.label === label)!, { userId: pim, purpose, on: frostbarrow.firstRunOn });
    expect(use('PYR-01', 'control-steel-pyrometer')).toBeNull();
    expect(use('PYR-02', 'sled-pyrometer')).toBeNull();
    // 120 days before the first run on 2027-01-09
    expect(use('PYR-04', 'sled-pyrometer')).toBe('PYR-04 was calibrated until 2026-09-11; use a calibrated instrument.');
    expect(use('PYR-02', 'control-steel-pyrometer')).toBe('PYR-02 is a sled pyrometer; the control steel is read with a control steel pyrometer.');
    expect(use('PYR-03', 'sled-pyrometer')).toBe('PYR-03 is assigned to another official.');
  });

  it('when the officials come back, then everyone with a role there is named, the organiser of every competition too', async () => {
    const body = await fieldData(frostbarrow.id);
    const ids = await userIdsByEmail();
    expect(body.officials).toHaveLength(demoUsers.length);
    expect(body.officials).toContainEqual({ userId: ids.get('start-official@frostbarrow.test'), displayName: 'Pim Aldous', role: 'official', area: 'start' });
    expect(body.officials).toContainEqual({ userId: ids.get('delegate@frostbarrow.test'), displayName: 'Teodor Vance', role: 'technical-delegate', area: null });
    expect(body.officials).toContainEqual({ userId: ids.get('organiser@frostbarrow.test'), displayName: 'Ilse Marrow', role: 'organiser', area: null });
    expect(body.officials.map((o) => o.displayName)).toEqual([...body.officials.map((o) => o.displayName)].sort((a, b) => a.localeCompare(b)));
  });

  it('when the profile comes back, then it is the frozen copy the rules route answers', async () => {
    const body = await fieldData(frostbarrow.id);
    const rules = await request(app).get(`/api/competitions/${frostbarrow.id}/rules-profile`).set('Cookie', official).expect(200);
    expect(body.profile).toEqual(competitionRulesProfileSchema.parse(rules.body));
    expect(body.profile?.frozenAt).toBe('2027-01-09T07:00:00.000Z');
  });

  it('when the artificial junior race is asked for, then it is open with its own start list and instruments', async () => {
    const body = await fieldData(glimmerdale.id);
    expect(body.competition).toMatchObject({ trackType: 'artificial', level: 'junior', status: 'open' });
    expect(body.profile?.profile.trackType).toBe('artificial');
    expect(body.profile?.frozenAt).toBe('2027-02-06T07:00:00.000Z');
    expect(body.startList).toEqual(demoStartLists[glimmerdale.id]);
    // The junior race's start list carries the (invented) official body weights the upper bound is worked out from.
    for (const entry of body.startList) {
      expect(entry.officialBodyWeight).toBeGreaterThan(0);
      expect(entry.secondOfficialBodyWeight !== null).toBe(entry.discipline === 'doubles');
    }
    expect(body.instruments.filter((i) => i.purpose === 'control-weight').map((i) => i.nominalMass)).toEqual([200, 200, 200, 200, 200]);
    expect(body.startList.map((e) => e.athlete)).not.toContain(demoStartLists[frostbarrow.id]![0]!.athlete);
    // trade practice, no published source: at least five control weights where an artificial-track scale stands
    expect(body.instruments.filter((i) => i.purpose === 'control-weight')).toHaveLength(5);
    expect(body.instruments.filter((i) => i.purpose === 'control-steel-pyrometer').map((i) => i.label)).toEqual(['PYR-11']);
    expect(body.officials.filter((o) => o.role === 'official')).toHaveLength(3);
  });

  it('when a competition has not opened, then the answer has no profile and an empty start list, not an error', async () => {
    const body = await fieldData(planned.id, organiser);
    expect(body.competition.status).toBe('planned');
    expect(body.profile).toBeNull();
    expect(body.startList).toEqual([]);
    expect(body.instruments).toEqual([]);
  });

  it('when the id is not a uuid, then 400; when it is unknown, then 404 in words', async () => {
    await request(app).get(fieldDataUrl('frostbarrow')).set('Cookie', organiser).expect(400);
    const response = await request(app).get(fieldDataUrl('0193a5c0-0000-7000-8000-0000000000ff')).set('Cookie', organiser).expect(404);
    expect(apiErrorBodySchema.parse(response.body).error.message).toBe('There is no such competition.');
  });
});

describe('the start list and instruments in the database', () => {
  it('when the demo is seeded again, then no start entry or instrument is added or changed', async () => {
    const before = await fieldData(demoOpenCompetitionId);
    expect(await seedDemoScenario(database.db)).toBe(0);
    const after = await fieldData(demoOpenCompetitionId);
    expect({ ...after, fetchedAt: null }).toEqual({ ...before, fetchedAt: null });
    const entryCount = (await database.db.select().from(startListEntries)).length;
    const instrumentCount = (await database.db.select().from(instruments)).length;
    expect(entryCount).toBe(Object.values(demoStartLists).flat().length);
    expect(instrumentCount).toBe(Object.values(demoInstruments).flat().length);
  });

  it('when a doubles sled is stored without its second athlete, or a bib twice, then the database refuses it', async () => {
    const doubles = { competitionId: planned.id, bib: 40, startOrder: 40, discipline: 'doubles' as const, athlete: 'Solo Example', secondAthlete: null };
    await expect(database.db.insert(startListEntries).values(doubles)).rejects.toThrow();
    const singles = { ...doubles, discipline: 'singles-men' as const };
    await database.db.insert(startListEntries).values(singles);
    await expect(database.db.insert(startListEntries).values({ ...singles, startOrder: 41 })).rejects.toThrow();
    await expect(database.db.insert(startListEntries).values({ ...singles, bib: 41 })).rejects.toThrow();
    // Body weights are tenths of a kg above 0; only a doubles sled has a second one.
    await expect(database.db.insert(startListEntries).values({ ...singles, bib: 42, startOrder: 42, officialBodyWeight: 0 })).rejects.toThrow();
    await expect(database.db.insert(startListEntries).values({ ...singles, bib: 43, startOrder: 43, secondOfficialBodyWeight: 700 })).rejects.toThrow();
    await database.db.delete(startListEntries).where(eq(startListEntries.competitionId, planned.id));
  });

  it('when an instrument has an unknown purpose, a certificate that is not a SHA-256 or a certified mass it cannot have, then the database refuses it', async () => {
    const base = { id: '0193a5c0-0001-7000-8000-0000000009f1', competitionId: planned.id, label: 'THM-01', calibratedUntil: '2027-06-01' };
    await expect(database.db.insert(instruments).values({ ...base, purpose: 'thermometer' as 'scale' })).rejects.toThrow();
    await expect(database.db.insert(instruments).values({ ...base, purpose: 'scale', certificateSha256: 'not-a-hash' })).rejects.toThrow();
    // Only a control weight has a certified mass, and it is above 0.
    await expect(database.db.insert(instruments).values({ ...base, purpose: 'scale', nominalMass: 200 })).rejects.toThrow();
    await expect(database.db.insert(instruments).values({ ...base, purpose: 'control-weight', nominalMass: 0 })).rejects.toThrow();
    expect(await database.db.select().from(instruments).where(eq(instruments.competitionId, planned.id))).toEqual([]);
  });
});

function isUncached(response: request.Response): boolean {
  return response.headers['cache-control'] === 'no-store';
}
