import type { DeviceDb, PhotoFile } from './device-db';
import { SyncTransportError } from './sync-transport';

/** How photo and certificate files reach the server (`/api/uploads/:sha256`). */
export interface UploadTransport {
  /** Whether the server already has the file (a resumed queue skips what arrived before). */
  hasFile(sha256: string): Promise<boolean>;
  putFile(sha256: string, mediaType: string, data: ArrayBuffer): Promise<void>;
}

export interface PhotoUploadSummary {
  sent: number;
  failed: number;
  /** Files whose record has not reached the server yet, or left for the next round. */
  waiting: number;
}

export const emptyPhotoUploadSummary = (): PhotoUploadSummary => ({ sent: 0, failed: 0, waiting: 0 });

/**
 * Sends the files in the photo queue, oldest first, each only once the server has one of the photo
 * records that show it (so the data goes first). Each file is marked sent on its own, so an
 * interrupted queue resumes where it stopped, and the server is asked before a file is sent again.
 * A file that fails keeps its reason and waits for the next round; it never stops the others or the
 * record sync. Only a lost connection ends the queue early, since every file after would fail too.
 */
export async function uploadWaitingPhotos(db: DeviceDb, uploads: UploadTransport, options: { now?: () => number } = {}): Promise<PhotoUploadSummary> {
  const now = options.now ?? Date.now;
  const summary = emptyPhotoUploadSummary();
  const queue = await db.photos.where('upload').equals('waiting').primaryKeys();
  for (const [index, sha256] of queue.entries()) {
    const photo = await db.photos.get(sha256);
    if (!photo || photo.upload !== 'waiting') continue;
    if (!(await serverHasRecordOf(db, photo))) {
      summary.waiting++;
      continue;
    }
    const triedAt = new Date(now()).toISOString();
    try {
      if (!(await uploads.hasFile(sha256))) await uploads.putFile(sha256, photo.mediaType, await bytesOf(db, sha256));
      await db.photos.update(sha256, { upload: 'sent', attempts: photo.attempts + 1, lastError: null, lastTriedAt: triedAt });
      summary.sent++;
    } catch (error) {
      await db.photos.update(sha256, { attempts: photo.attempts + 1, lastError: describeUploadFailure(error), lastTriedAt: triedAt });
      summary.failed++;
      if (error instanceof SyncTransportError && error.failure === 'unreachable') {
        summary.waiting += queue.length - index - 1;
        break;
      }
    }
  }
  return summary;
}

async function bytesOf(db: DeviceDb, sha256: string): Promise<ArrayBuffer> {
  const stored = await db.photoBytes.get(sha256);
  if (!stored) throw new Error('the file is missing from this device');
  return stored.data;
}

async function serverHasRecordOf(db: DeviceDb, photo: PhotoFile): Promise<boolean> {
  const known = await db.serverRecords.bulkGet(photo.recordIds);
  return known.some((record) => record !== undefined);
}

function describeUploadFailure(error: unknown): string {
  if (error instanceof SyncTransportError) return error.message;
  return `The file could not be sent (${error instanceof Error ? error.message : String(error)}). It stays on this device and is tried again.`;
}
