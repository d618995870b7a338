import { v4 as uuidv4 } from 'uuid';
import { z } from 'zod';
import { keep, readKept } from './local-json';

const deviceIdKey = 'rimelog.device-id';

/**
 * The id of this device (this browser on this phone or tablet), made once and kept: sessions and PINs
 * belong to a device, and records will say which device made them.
 */
export function deviceId(): string {
  const kept = readKept(deviceIdKey, z.uuid());
  if (kept) return kept;
  const made = uuidv4();
  keep(deviceIdKey, made);
  return made;
}
