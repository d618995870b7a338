import { formatTenths, type Measurement } from '../../../../shared/rules/measurement';
import type { TimedReading } from '../../../../shared/rules/temperature';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';
import { clockTime } from './clock-time';

const controlFields = recordFieldSchemas['control-reading'];

/** One line of the control steel log. */
export interface ControlLogEntry {
  id: string;
  takenAt: string;
  reading: Measurement;
  /** "−6.2 °C", to the tenth, with the true minus sign. */
  readingText: string;
  /** "09:05" on this device's clock. */
  timeText: string;
  officialId: string;
  instrumentId: string;
  iceText: string | null;
  airText: string | null;
  /** The server has not confirmed it yet. */
  isOnlyOnDevice: boolean;
  /** For a correction: when the reading it corrects was taken, and why it was corrected. */
  correction: { ofTimeText: string; reason: string } | null;
  /** A later record corrects this one; its value no longer counts. */
  isCorrected: boolean;
}

export interface ControlLog {
  /** Newest first; a correction comes before the reading it corrects. */
  entries: ControlLogEntry[];
  /** Records this version of the app cannot read (never hidden without saying so). */
  unreadable: number;
}

const temperature = (value: Measurement | null) => (value ? formatTenths(value.tenths, value.unit) : null);

/** The control-reading records of one competition as the log shows them. */
export function controlLog(records: readonly LocalRecord[]): ControlLog {
  const live = records.filter((record) => !record.deleted);
  const correctedIds = new Set(live.map((record) => record.supersedes).filter((id) => id !== null));
  const byId = new Map(live.map((record) => [record.id, record]));
  const sortable: { entry: ControlLogEntry; hlc: string }[] = [];
  let unreadable = 0;
  for (const record of live) {
    const parsed = controlFields.safeParse(record.fields);
    if (!parsed.success) {
      unreadable++;
      continue;
    }
    const fields = parsed.data;
    const supersedes = record.supersedes ?? fields.supersedes;
    const corrected = supersedes === null ? undefined : byId.get(supersedes);
    const correctedAt = typeof corrected?.fields['takenAt'] === 'string' ? corrected.fields['takenAt'] : fields.takenAt;
    const entry: ControlLogEntry = {
      id: record.id,
      takenAt: fields.takenAt,
      reading: fields.reading,
      readingText: formatTenths(fields.reading.tenths, fields.reading.unit),
      timeText: clockTime(fields.takenAt),
      officialId: record.createdBy,
      instrumentId: fields.instrumentId,
      iceText: temperature(fields.ice),
      airText: temperature(fields.air),
      isOnlyOnDevice: record.version === null,
      correction: supersedes === null ? null : { ofTimeText: clockTime(correctedAt), reason: fields.reason ?? '' },
      isCorrected: correctedIds.has(record.id),
    };
    sortable.push({ entry, hlc: record.hlc });
  }
  // A correction keeps the time of the reading it corrects; the newer change (hybrid clock) goes first.
  sortable.sort(
    (a, b) => Date.parse(b.entry.takenAt) - Date.parse(a.entry.takenAt) || (a.hlc < b.hlc ? 1 : a.hlc > b.hlc ? -1 : 0),
  );
  return { entries: sortable.map(({ entry }) => entry), unreadable };
}

/** The readings that count (none that a correction replaced), as the rules engine takes them. */
export function currentReadings(entries: readonly ControlLogEntry[]): TimedReading[] {
  return entries
    .filter((entry) => !entry.isCorrected)
    .map((entry) => ({ reading: entry.reading, takenAt: entry.takenAt }));
}
