import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';
import { clockTime } from './clock-time';
import type { ControlLogEntry } from './control-log';

/** The words the measuring official signs under; kept in each log signature as shown. */
export const signingStatement = 'I took these readings with the instruments named, on the control steel of this competition.';

/** One signature covers at most this many readings (the limit of the record kind); the rest wait for the next one. */
export const maxReadingsPerSignature = 500;

const signatureFields = recordFieldSchemas['log-signature'];

/** A signature under the control steel log, as the log shows it. */
export interface LogSignatureLine {
  id: string;
  officialId: string;
  /** "09:25" on this device's clock. */
  timeText: string;
  readingCount: number;
  /** A photo record with the signature's picture is on this device. */
  hasPicture: boolean;
  /** The device it was signed on: its picture is saved there, right after the signature. */
  deviceId: string;
}

/** The ids a log signature lists, read leniently so that a signature from a newer app version still freezes them. */
function listedIds(signature: LocalRecord): string[] {
  const listed = signature.fields['readingIds'];
  return Array.isArray(listed) ? listed.filter((id): id is string => typeof id === 'string') : [];
}

const liveSignatures = (records: readonly LocalRecord[]) => records.filter((record) => record.kind === 'log-signature' && !record.deleted);

/** The readings some signature on this device covers: frozen, so the device never corrects them. */
export function signedReadingIds(records: readonly LocalRecord[]): ReadonlySet<string> {
  return new Set(liveSignatures(records).flatMap(listedIds));
}

/**
 * The readings `officialId` signs now: their own readings in the log that no signature covers, corrections
 * included, oldest first, up to what one signature covers; `left` is how many wait for the next signature.
 * Each official signs only what they measured: the statement says "I took these readings".
 */
export function readingsToSign(
  entries: readonly ControlLogEntry[],
  signed: ReadonlySet<string>,
  officialId: string | null,
): { readings: ControlLogEntry[]; left: number } {
  const unsigned = entries.filter((entry) => entry.officialId === officialId && !signed.has(entry.id)).reverse();
  return { readings: unsigned.slice(0, maxReadingsPerSignature), left: Math.max(0, unsigned.length - maxReadingsPerSignature) };
}

/** The log's signatures, newest first, each with whether its picture (a photo with purpose 'signature') is here. */
export function logSignatures(records: readonly LocalRecord[], photos: readonly LocalRecord[]): LogSignatureLine[] {
  const pictured = new Set(
    photos.filter((photo) => !photo.deleted && photo.fields['purpose'] === 'signature').map((photo) => photo.fields['of']),
  );
  return liveSignatures(records)
    .sort((a, b) => (a.hlc < b.hlc ? 1 : a.hlc > b.hlc ? -1 : 0))
    .map((record) => {
      const parsed = signatureFields.safeParse(record.fields);
      return {
        id: record.id,
        officialId: record.createdBy,
        // A signature this version cannot read still shows, and still freezes what it lists.
        timeText: parsed.success ? clockTime(parsed.data.signedAt) : '--:--',
        readingCount: listedIds(record).length,
        hasPicture: pictured.has(record.id),
        deviceId: record.deviceId,
      };
    });
}
