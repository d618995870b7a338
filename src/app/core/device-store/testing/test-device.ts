import { IDBFactory, IDBKeyRange } from 'fake-indexeddb';
import { v4 as uuidv4 } from 'uuid';
import { openDeviceDb, type DeviceDb } from '../device-db';

let opened = 0;

/** A fresh device database on its own fake IndexedDB, so tests never see each other's rows. */
export function openTestDevice(deviceId: string = uuidv4()): Promise<DeviceDb> {
  opened++;
  return openDeviceDb({ name: `rimelog-device-test-${opened}`, deviceId, indexedDB: new IDBFactory(), IDBKeyRange });
}

export const competitionId = '0190a7e2-0000-7000-8000-000000000001';
export const official = 'official-anna';
export const otherOfficial = 'official-ben';
export const leader = 'leader-carla';

export const startCheck = (bib: number, note = '') => ({ run: 1, bib, status: 'in-progress', beganAt: '2027-01-14T09:30:00.000Z', note });
export const measurement = (tenths: number) => ({
  checkId: '0190a7e2-0000-7000-8000-0000000000c1',
  what: 'sled weight',
  value: { tenths, unit: 'kilogram' },
  takenAt: '2027-01-14T09:31:00.000Z',
});
