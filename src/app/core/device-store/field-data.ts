import { fieldDataSchema, type FieldData } from '../../../../shared/competition/field-data';
import type { DeviceDb } from './device-db';

export type KeepFieldDataResult = { kept: true; data: FieldData } | { kept: false; problem: string };

/**
 * Keeps the server's answer as this device's copy of the competition's field data, replacing the old
 * copy whole; an answer that does not parse is refused and the old copy stays, so a bad answer never
 * leaves the start area without its start list.
 */
export async function keepFieldData(db: DeviceDb, answer: unknown, now: () => number = Date.now): Promise<KeepFieldDataResult> {
  const parsed = fieldDataSchema.safeParse(answer);
  if (!parsed.success) {
    const where = parsed.error.issues[0]?.path.join('.') || 'the answer';
    return {
      kept: false,
      problem: `The start list and instruments from the server could not be read by this version of the app (${where}), so the copy on this device stays in use. Update the app at the hut.`,
    };
  }
  const data = parsed.data;
  await db.fieldData.put({ competitionId: data.competitionId, data, keptAt: new Date(now()).toISOString() });
  return { kept: true, data };
}

/** This device's copy of the competition's field data, or null when it has none it can read. */
export async function readFieldData(db: DeviceDb, competitionId: string): Promise<FieldData | null> {
  const row = await db.fieldData.get(competitionId);
  if (!row) return null;
  // A copy kept by an earlier version of the app may not fit today's shape: better none than a wrong one.
  const parsed = fieldDataSchema.safeParse(row.data);
  return parsed.success ? parsed.data : null;
}
