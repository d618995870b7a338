import { z } from 'zod';
import { forget, keep, readKept } from '../../auth/local-json';

/** Ice and air kept for the next control reading, in whole tenths of °C. */
export interface KeptWeather {
  ice: number | null;
  air: number | null;
}

/** Ice and air go with the reading taken now: kept longer than this, they belong to another reading. */
export const keptWeatherMaxAgeMs = 60 * 60_000;

const keptSchema = z.object({ ice: z.int().nullable(), air: z.int().nullable(), savedAt: z.number() });
const keyOf = (competitionId: string) => `rimelog.control-steel.weather.${competitionId}`;
const nothingKept: KeptWeather = { ice: null, air: null };

/** What was kept on this device for the competition's next reading, so a killed app keeps it; stale values are dropped. */
export function readKeptWeather(competitionId: string, now: number): KeptWeather {
  const kept = readKept(keyOf(competitionId), keptSchema);
  if (!kept || now - kept.savedAt > keptWeatherMaxAgeMs) return nothingKept;
  return { ice: kept.ice, air: kept.air };
}

export function keepWeather(competitionId: string, weather: KeptWeather, now: number): void {
  keep(keyOf(competitionId), { ...weather, savedAt: now });
}

/** Once the reading they went with is saved. */
export function forgetWeather(competitionId: string): void {
  forget(keyOf(competitionId));
}
