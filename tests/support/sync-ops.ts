import { randomUUID } from 'node:crypto';
import { v7 as uuidv7 } from 'uuid';
import type { SyncOpInput } from '../../shared/sync/sync-api';

export const openRaceId = '0193a5c0-0000-7000-8000-000000000001';

/** Builds ops the way a device does: one device, numbered 1, 2, 3 ... */
export function deviceOps(userId: string, deviceId: string = randomUUID()) {
  let seq = 0;
  let clock = 0;
  const op = (parts: Partial<SyncOpInput> & Pick<SyncOpInput, 'action' | 'recordKind'>): SyncOpInput => {
    seq += 1;
    clock += 1;
    return {
      opId: uuidv7(),
      deviceId,
      seq,
      userId,
      hlc: `${String(1_800_000_000_000 + clock).padStart(15, '0')}-00000-${deviceId}`,
      madeAt: '2027-01-09T09:00:00.000Z',
      competitionId: openRaceId,
      area: 'start',
      recordId: uuidv7(),
      fields: {},
      base: {},
      ...parts,
    };
  };
  return { deviceId, op };
}

export const controlReading = (tenths: number) => ({
  reading: { tenths, unit: 'celsius' },
  takenAt: '2027-01-09T09:00:00.000Z',
  instrumentId: 'pyrometer-c1',
});

export const startCheck = (bib: number, run = 1) => ({ run, bib, status: 'in-progress', beganAt: '2027-01-09T09:10:00.000Z' });
