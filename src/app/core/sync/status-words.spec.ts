import type { SyncStatus } from '../device-store/sync-engine';
import { clockWords, stripItems, syncedWords } from './status-words';

const at = Date.parse('2027-01-14T09:30:00.000Z');
const minutesBefore = (minutes: number) => new Date(at - minutes * 60_000).toISOString();
const status = (change: Partial<SyncStatus> = {}): SyncStatus => ({
  online: true,
  syncing: false,
  pendingCount: 0,
  rejectedCount: 0,
  openConflicts: 0,
  lastSyncAt: minutesBefore(3),
  lastError: null,
  clockOffsetMs: 0,
  clockWarning: null,
  photosWaiting: 0,
  photoError: null,
  ...change,
});
const texts = (s: SyncStatus) => stripItems(s, at).map((item) => item.text);

describe('status strip words', () => {
  it('when the last good round was 3 minutes ago, then it says "Synced 3 min ago"; hours and days read the same way', () => {
    expect(syncedWords(minutesBefore(3), at)).toBe('Synced 3 min ago');
    expect(syncedWords(minutesBefore(0.5), at)).toBe('Synced just now');
    expect(syncedWords(minutesBefore(125), at)).toBe('Synced 2 h ago');
    expect(syncedWords(minutesBefore(60 * 24), at)).toBe('Synced 1 day ago');
    expect(syncedWords(null, at)).toBe('Not synced yet');
  });

  it('when the device clock was set back after a sync, then it never says the sync is in the future', () => {
    expect(syncedWords(new Date(at + 10 * 60_000).toISOString(), at)).toBe('Synced just now');
  });

  it('when all is well, then it says online, nothing waiting and the last sync, and nothing asks for attention', () => {
    const items = stripItems(status(), at);
    expect(items.map((i) => i.text)).toEqual(['Online', 'Nothing waiting to send', 'Synced 3 min ago']);
    expect(items.some((i) => i.attention)).toBe(false);
  });

  it('when offline with records waiting, then both are said in words, and a failed round adds no second warning', () => {
    const words = texts(status({ online: false, pendingCount: 4, lastError: 'The server cannot be reached from here.' }));
    expect(words).toEqual(['Offline: server not reachable', '4 records only on this device', 'Synced 3 min ago']);
    expect(texts(status({ pendingCount: 1 }))).toContain('1 record only on this device');
  });

  it('when conflicts, refusals and a refused round are there, then each is its own marked item', () => {
    const items = stripItems(status({ openConflicts: 2, rejectedCount: 1, lastError: 'Sign in again so this device can send its records.' }), at);
    const marked = items.filter((i) => i.attention).map((i) => [i.mark, i.text]);
    expect(marked).toEqual([
      ['⚠', '2 conflicts waiting'],
      ['⚠', '1 record refused by the server'],
      ['⚠', 'Last sync failed: tap for why'],
    ]);
  });

  it('when photos wait for the signal, then they are counted; when one was refused, it asks for a look', () => {
    expect(texts(status({ online: false, photosWaiting: 2, photoError: 'The server cannot be reached from here.' }))).toContain('2 photos to upload');
    const refused = stripItems(status({ photosWaiting: 1, photoError: 'This file is not the JPEG photo it was sent as, so it was not kept.' }), at);
    expect(refused.find((i) => i.key === 'photos')).toEqual({ key: 'photos', mark: '⚠', text: '1 photo to upload: tap for why', attention: true });
    expect(texts(status()).some((text) => text.includes('photo'))).toBe(false);
  });

  it('when the device clock is more than 2 minutes off, then it says by how much and which way; at 2 minutes it says nothing', () => {
    expect(clockWords(-5 * 60_000)).toBe('Device clock 5 min behind: set the time');
    expect(clockWords(3 * 60_000 + 10_000)).toBe('Device clock 3 min ahead: set the time');
    expect(clockWords(2 * 60_000)).toBeNull();
    expect(clockWords(null)).toBeNull();
  });
});
