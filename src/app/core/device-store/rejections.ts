import { isShownRejection, type DeviceDb, type Rejection } from './device-db';
import { RecordRefusedError, storageFailure } from './store-errors';

/**
 * Puts a refusal away once the official has dealt with it. The row is kept, marked with who put it away
 * and when, so the refused values stay on the device as evidence; it only leaves the screen.
 */
export async function dismissRejection(db: DeviceDb, opId: string, userId: string, now: () => number = Date.now): Promise<void> {
  let found = false;
  try {
    await db.transaction('rw', db.rejections, async () => {
      const rejection = await db.rejections.get(opId);
      if (!rejection) return;
      found = true;
      if (rejection.dismissed) return;
      await db.rejections.put({ ...rejection, dismissed: { userId, at: new Date(now()).toISOString() } });
    });
  } catch (error) {
    throw storageFailure(error);
  }
  if (!found) throw new RecordRefusedError('This refusal is no longer on this device.');
}

/** Refused changes still shown (not put away), newest first. */
export async function readRejections(db: DeviceDb): Promise<Rejection[]> {
  const rejections = await db.rejections.filter(isShownRejection).toArray();
  return rejections.sort((a, b) => b.rejectedAt.localeCompare(a.rejectedAt) || b.op.seq - a.op.seq);
}
