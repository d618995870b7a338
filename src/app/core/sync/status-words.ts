import { clockWarningMs } from '../../../../shared/sync/hybrid-clock';
import type { SyncStatus } from '../device-store/sync-engine';

/** One part of the status strip: a mark and words, so nothing depends on colour. */
export interface StripItem {
  key: 'online' | 'waiting' | 'photos' | 'synced' | 'conflicts' | 'refused' | 'failed' | 'clock';
  mark: string;
  text: string;
  /** Needs the official's attention: drawn boxed and bold, besides its words. */
  attention: boolean;
}

const plural = (count: number, one: string, many: string) => `${count} ${count === 1 ? one : many}`;

/** What the status strip says, in reading order. */
export function stripItems(status: SyncStatus, nowMs: number): StripItem[] {
  const items: StripItem[] = [onlineItem(status.online)];
  items.push(
    status.pendingCount === 0
      ? { key: 'waiting', mark: '✓', text: 'Nothing waiting to send', attention: false }
      : { key: 'waiting', mark: '↑', text: `${plural(status.pendingCount, 'record', 'records')} only on this device`, attention: false },
  );
  if (status.photosWaiting > 0) {
    // A file that failed for a reason other than the signal needs a look; waiting for the signal does not.
    const stuck = status.photoError !== null && status.online !== false;
    items.push({ key: 'photos', mark: stuck ? '⚠' : '↑', text: `${plural(status.photosWaiting, 'photo', 'photos')} to upload${stuck ? ': tap for why' : ''}`, attention: stuck });
  }
  items.push({ key: 'synced', mark: '↻', text: status.syncing ? 'Syncing now…' : syncedWords(status.lastSyncAt, nowMs), attention: false });
  if (status.openConflicts > 0) {
    items.push({ key: 'conflicts', mark: '⚠', text: plural(status.openConflicts, 'conflict waiting', 'conflicts waiting'), attention: true });
  }
  if (status.rejectedCount > 0) {
    items.push({ key: 'refused', mark: '⚠', text: `${plural(status.rejectedCount, 'record', 'records')} refused by the server`, attention: true });
  }
  // Offline already says why nothing went; any other failure (signed out, refused) needs a look.
  if (status.lastError && status.online !== false) {
    items.push({ key: 'failed', mark: '⚠', text: 'Last sync failed: tap for why', attention: true });
  }
  const clock = clockWords(status.clockOffsetMs);
  if (clock) items.push({ key: 'clock', mark: '⚠', text: clock, attention: true });
  return items;
}

function onlineItem(online: boolean | null): StripItem {
  if (online === true) return { key: 'online', mark: '✓', text: 'Online', attention: false };
  if (online === false) return { key: 'online', mark: '✕', text: 'Offline: server not reachable', attention: true };
  return { key: 'online', mark: '…', text: 'Checking the server', attention: false };
}

/** "Synced 3 min ago", from the last good round; the device clock, so a clock jump never says "in 5 min". */
export function syncedWords(lastSyncAt: string | null, nowMs: number): string {
  if (lastSyncAt === null) return 'Not synced yet';
  const minutes = Math.floor(Math.max(0, nowMs - Date.parse(lastSyncAt)) / 60_000);
  if (minutes < 1) return 'Synced just now';
  if (minutes < 60) return `Synced ${minutes} min ago`;
  const hours = Math.floor(minutes / 60);
  if (hours < 24) return `Synced ${hours} h ago`;
  return `Synced ${plural(Math.floor(hours / 24), 'day', 'days')} ago`;
}

/** The short clock warning, when the device clock is more than 2 minutes off the server's. */
export function clockWords(offsetMs: number | null): string | null {
  if (offsetMs === null || Math.abs(offsetMs) <= clockWarningMs) return null;
  const minutes = Math.round(Math.abs(offsetMs) / 60_000);
  return `Device clock ${minutes} min ${offsetMs > 0 ? 'ahead' : 'behind'}: set the time`;
}
