import { firstValueFrom } from 'rxjs';
import type { WriteResult } from '../../core/device-store/record-writer';
import type { DeviceStore } from '../../core/sync/device-store';
import type { SpotReading } from '../steel-temperatures/steel-spots';
import { savedAt, savedSteelReadings, steelMeasurementFields } from './check-steel';

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
