// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { AuthStore } from '../auth/auth-store';
import { firstOfficial } from '../auth/testing/auth-fixtures';
import { exportBackup } from '../core/device-store/backup';
import type { DeviceDb } from '../core/device-store/device-db';
import { createRecordWriter } from '../core/device-store/record-writer';
import { FakeSyncServer } from '../core/device-store/testing/fake-sync-server';
import { competitionId, measurement, openTestDevice, otherOfficial, startCheck } from '../core/device-store/testing/test-device';
import { FileDownload } from '../core/sync/file-download';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../core/sync/testing/test-device-store';
import { appTestProviders, blankRoutes } from '../testing/app-test-providers';
import { SyncPage } from './sync-page';

/** Keeps what the page handed to the browser's downloads. */
class SavedFiles {
  readonly files: { fileName: string; contents: string }[] = [];
  save(fileName: string, contents: string): void {
    this.files.push({ fileName, contents });
  }
}

async function setUp({ server = new FakeSyncServer(), storage = new FakeBrowserStorage() } = {}) {
  localStorage.clear();
  const saved = new SavedFiles();
  let opened: DeviceDb | null = null;
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders(blankRoutes('', 'sync')),
      ...provideTestDeviceStore(server, storage, (db) => (opened = db)),
      { provide: FileDownload, useValue: saved },
    ],
  });
  const store = await startSignedIn(firstOfficial);
  const fixture = TestBed.createComponent(SyncPage);
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const text = (selector = ':scope') => {
    fixture.detectChanges();
    return element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  const press = (label: string) => {
    fixture.detectChanges();
    const button = [...element.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.trim() === label);
    if (!button) throw new Error(`No button "${label}"`);
    if (button.disabled) throw new Error(`Button "${label}" is disabled`);
    button.click();
  };
  const buttonLabels = () => {
    fixture.detectChanges();
    return [...element.querySelectorAll<HTMLButtonElement>('button')].map((b) => b.textContent?.replace(/\s+/g, ' ').trim() ?? '');
  };
  const db = () => opened!;
  return { server, storage, store, saved, fixture, element, text, press, buttonLabels, db };
}

describe('SyncPage', () => {
  it('when records wait offline and "Sync now" is pressed with the server back, then the engine sends them and the counts empty', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store, text, press, element } = await setUp({ server });
    await store.createRecord('start-check', competitionId, 'start', startCheck(4));
    await store.createRecord('start-check', competitionId, 'start', startCheck(5));
    await store.createRecord('control-reading', competitionId, 'start', {
      reading: { tenths: -49, unit: 'celsius' },
      takenAt: '2027-01-14T09:00:00.000Z',
      instrumentId: 'probe-1',
    });
    await until(() => text('[data-kind="control-reading"]') !== '', 'the outbox is counted');
    expect(text('[data-kind="start-check"]')).toBe('Start checks: 2');
    expect(text('[data-kind="control-reading"]')).toBe('Control steel readings: 1');
    expect(text('[data-section="last-error"]')).toContain('cannot be reached');

    server.outage = null;
    press('Sync now');

    await until(() => text('[data-section="round"]').startsWith('Synced'), 'the round is over');
    expect(server.received.map((op) => op.recordKind).sort()).toEqual(['control-reading', 'start-check', 'start-check']);
    expect(text('[data-section="round"]')).toContain('3 changes sent');
    await until(() => text('[data-fact="waiting"]').includes('Nothing waiting') && element.querySelector('[data-kind]') === null, 'the counts are empty');
    expect(element.querySelector('[data-section="last-error"]')).toBeNull();
    // The sync button is the 72 px primary action.
    expect(element.querySelector('button.primary-action')?.textContent?.trim()).toBe('Sync now');
  });

  it('when the server refuses a record, then the page shows which record, who made it and why, in words', async () => {
    const server = new FakeSyncServer();
    server.refuse = (op) => (op.recordKind === 'start-check' ? 'You are no longer assigned to the start area of this race.' : null);
    const { store, text } = await setUp({ server });
    await store.createRecord('start-check', competitionId, 'start', startCheck(7));
    await store.syncNow();

    await until(() => text('[data-section="refusal"]') !== '', 'the refusal shows');
    const refusal = text('[data-section="refusal"]');
    expect(refusal).toContain('Start check (new): run 1, bib 7');
    expect(refusal).toContain('Why: You are no longer assigned to the start area of this race.');
    expect(refusal).toContain('by First Official');
  });

  it('when a photo file is refused, then the page counts it as waiting and says why in words; the records went anyway', async () => {
    const server = new FakeSyncServer();
    server.refuseFile = () => 'This file is not the PDF document it was sent as, so it was not kept.';
    const { store, text } = await setUp({ server });
    const { record } = await store.createRecord('start-check', competitionId, 'start', startCheck(8));
    await store.attachPhoto(record.id, new Blob(['%PDF-1.7'], { type: 'application/pdf' }), 'certificate');
    await store.syncNow();

    await until(() => text('[data-section="photo-error"]') !== '', 'the photo problem shows');
    expect(text('[data-section="photos"]')).toContain('1 photo file waits to upload');
    expect(text('[data-section="photo-error"]')).toContain('This file is not the PDF document it was sent as, so it was not kept.');
    expect(server.records.size).toBe(2);
  });

  it('when "Export backup" is pressed, then a file named by this device and the time holds the waiting changes', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store, saved, press, text } = await setUp({ server });
    await store.createRecord('start-check', competitionId, 'start', startCheck(9));
    const before = Date.now();

    press('Export backup');

    await until(() => saved.files.length === 1, 'the file is handed over');
    const { fileName, contents } = saved.files[0]!;
    const match = /^rimelog-backup-([0-9a-f-]{36})-(\d{8}T\d{6}Z)\.json$/.exec(fileName);
    expect(match?.[1]).toBe(store.deviceId);
    const stamp = match![2]!.replace(/^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/, '$1-$2-$3T$4:$5:$6Z');
    expect(Math.abs(Date.parse(stamp) - before)).toBeLessThan(5_000);
    const file = JSON.parse(contents) as { deviceId: string; ops: { fields: { bib: number } }[] };
    expect(file.deviceId).toBe(store.deviceId);
    expect(file.ops.map((op) => op.fields.bib)).toEqual([9]);
    await until(() => text('[data-section="backup"]').includes(fileName), 'the page names the file');
  });

  it('when a backup from another device is imported, then its changes are sent, and a second import changes nothing on the server', async () => {
    const { server, element, text } = await setUp();
    const otherDb = await openTestDevice();
    const other = createRecordWriter({ db: otherDb });
    await other.createRecord('measurement', competitionId, 'start', measurement(231), otherOfficial);
    const backup = await exportBackup(otherDb);
    otherDb.close();
    const choose = () => {
      const input = element.querySelector<HTMLInputElement>('input[type="file"]')!;
      Object.defineProperty(input, 'files', { configurable: true, value: [new File([backup.contents], backup.fileName, { type: 'application/json' })] });
      input.dispatchEvent(new Event('change'));
    };

    choose();
    await until(() => text('[data-section="backup"]').includes('Synced'), 'the import and its sync are over');
    expect(text('[data-section="backup"]')).toContain('1 change added, 0 already here');
    expect(server.received.map((op) => op.userId)).toEqual([otherOfficial]);

    const sentBefore = server.received.length;
    choose();
    await until(() => server.received.length > sentBefore && text('[data-section="backup"]').includes('Synced'), 'the second import is over');
    // The same op id again: the server gives its stored answer and keeps one record.
    expect(server.receipts.size).toBe(1);
    expect(server.records.size).toBe(1);
    await until(() => text('[data-fact="waiting"]').includes('Nothing waiting'), 'the outbox is empty again');
  });

  it('when the browser keeps the records, then the storage says so; when it may clear them, it says to sync often', async () => {
    const storage = new FakeBrowserStorage();
    storage.grants = false;
    const { text, press } = await setUp({ storage });
    await until(() => text('[data-section="persistence"]').includes('may clear'), 'the refusal to persist shows');
    expect(text('[data-section="persistence"]')).toContain('sync often');
    expect(text('[data-section="usage"]')).toBe('12.0 MB of 2.0 GB used (1 %).');
    expect(storage.persistCalls).toBe(1);

    storage.grants = true;
    press('Ask the browser to keep the records');
    await until(() => text('[data-section="persistence"]').includes('kept safe by the browser'), 'the grant shows');
  });

  describe('putting a refusal away', () => {
    /** Two start checks the server refused (bibs 7 and 8), shown on the page. */
    async function withTwoRefusals() {
      const server = new FakeSyncServer();
      server.refuse = (op) => (op.recordKind === 'start-check' ? 'You are no longer assigned to the start area of this race.' : null);
      const page = await setUp({ server });
      const seven = await page.store.createRecord('start-check', competitionId, 'start', startCheck(7));
      await page.store.createRecord('start-check', competitionId, 'start', startCheck(8));
      await page.store.syncNow();
      const refusals = () => {
        page.fixture.detectChanges();
        return [...page.element.querySelectorAll('[data-section="refusal"] > strong')].map((strong) => strong.textContent?.trim() ?? '');
      };
      await until(() => refusals().length === 2, 'both refusals show');
      const putAwayLabel = (bib: number) => {
        const label = page.buttonLabels().find((text) => text.startsWith('Put away:') && text.includes(`bib ${bib}`));
        if (!label) throw new Error(`No "Put away" button for bib ${bib}`);
        return label;
      };
      return { ...page, refusals, putAwayLabel, sevenOpId: seven.op!.opId };
    }

    it('when "Put away" is pressed, then it asks first in words, and "No, keep it in the list" changes nothing', async () => {
      const { press, text, refusals, putAwayLabel, db, sevenOpId } = await withTwoRefusals();
      expect(putAwayLabel(7)).toContain('Start check (new): run 1, bib 7');

      press(putAwayLabel(7));

      expect(text('[data-section="put-away-question"] p')).toBe(
        'Have you entered these values again the right way? Putting this away keeps it on the device but hides it.',
      );
      // The harmless answer has the focus, so a second tap or Enter does not put it away.
      expect(document.activeElement?.textContent?.trim()).toBe('No, keep it in the list');
      expect((await db().rejections.get(sevenOpId))?.dismissed ?? null).toBeNull();

      press('No, keep it in the list');

      expect(text('[data-section="put-away-question"]')).toBe('');
      expect(refusals()).toHaveLength(2);
      expect((await db().rejections.get(sevenOpId))?.dismissed ?? null).toBeNull();
    });

    it('when the official confirms, then that refusal leaves the list and stays on the device with who put it away and when', async () => {
      const { press, text, refusals, putAwayLabel, db, sevenOpId } = await withTwoRefusals();
      const before = Date.now();

      press(putAwayLabel(7));
      press('Yes, put it away');

      await until(() => refusals().length === 1, 'the refusal leaves the list');
      expect(refusals()[0]).toContain('bib 8');
      expect(text('[data-section="put-away"]')).toMatch(/^Put away: Start check \(new\): run 1, bib 7.*Its values stay on this device\.$/);
      const kept = await db().rejections.get(sevenOpId);
      expect(kept?.op.fields['bib']).toBe(7);
      expect(kept?.reason).toBe('You are no longer assigned to the start area of this race.');
      expect(kept?.dismissed?.userId).toBe(firstOfficial.user.id);
      expect(Math.abs(Date.parse(kept!.dismissed!.at) - before)).toBeLessThan(5_000);
    });

    it('when putting away fails (no official signed in any more), then the page says so in words and the refusal stays', async () => {
      const { press, text, refusals, putAwayLabel, db, sevenOpId } = await withTwoRefusals();
      press(putAwayLabel(7));
      const signedOut = TestBed.inject(AuthStore).signOut();
      TestBed.inject(HttpTestingController).expectOne('/api/auth/sign-out').flush(null);
      await signedOut;

      press('Yes, put it away');

      await until(() => text('[data-section="put-away-problem"]') !== '', 'the problem shows');
      expect(text('[data-section="put-away-problem"]')).toBe('⚠ Not put away. Sign in first: putting a refusal away says who did it.');
      expect(refusals()).toHaveLength(2);
      expect((await db().rejections.get(sevenOpId))?.dismissed ?? null).toBeNull();
      // The question stays open, so it can be tried again after signing in.
      expect(text('[data-section="put-away-question"]')).toContain('Have you entered these values again');
    });
  });
});
