import { firstValueFrom } from 'rxjs';
import type { WriteResult } from '../../core/device-store/record-writer';
import type { DeviceStore } from '../../core/sync/device-store';
import type { SpotReading } from '../steel-temperatures/steel-spots';
import { isAlreadyReported, savedAt, savedSteelReadings, steelMeasurementFields, steelViolationFields, type FailedSpot } from './check-steel';

export interface SteelReadingToSave {
  competitionId: string;
  checkId: string;
  reading: SpotReading;
  instrumentId: string;
}

/**
 * Saves one steel reading as a measurement. A spot read again corrects the reading saved there ("read
 * again"); a reading that takes over from another spot corrects that spot's reading ("read at another
 * spot"). Measurements are never edited, so the earlier value stays as evidence. Reads the records
 * afresh, so call one at a time.
 */
export async function saveSteelReading(store: DeviceStore, { competitionId, checkId, reading, instrumentId }: SteelReadingToSave): Promise<WriteResult> {
  const saved = savedSteelReadings(await firstValueFrom(store.watchRecords(competitionId, 'measurement')), checkId);
  const fields = steelMeasurementFields(checkId, reading, instrumentId);
  const readAgain = savedAt(saved, reading);
  if (readAgain) return store.correctRecord(readAgain.id, fields, 'read again');
  const replaced = reading.replacesSpot === undefined ? null : savedAt(saved, { steel: reading.steel, spot: reading.replacesSpot });
  if (replaced) return store.correctRecord(replaced.id, fields, 'read at another spot');
  return store.createRecord('measurement', competitionId, 'start', fields);
}

/**
 * Records the violation for the readings over the limit (once: a violation already recorded for the same
 * measurements is not recorded again), then sets the check's result to "violation".
 */
export async function reportSteelViolation(store: DeviceStore, competitionId: string, checkId: string, failed: readonly FailedSpot[]): Promise<void> {
  const violations = await firstValueFrom(store.watchRecords(competitionId, 'violation'));
  if (!isAlreadyReported(violations, checkId, failed)) {
    await store.createRecord('violation', competitionId, 'start', steelViolationFields(checkId, failed));
  }
  await store.updateRecord(checkId, { status: 'violation' });
}
