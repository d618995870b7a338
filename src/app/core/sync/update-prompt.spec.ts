// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { TestBed } from '@angular/core/testing';
import { SwUpdate, type VersionEvent } from '@angular/service-worker';
import { NEVER, Subject } from 'rxjs';
import { firstOfficial } from '../../auth/testing/auth-fixtures';
import { FakeSyncServer } from '../device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../device-store/testing/test-device';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { AppUpdate, RELOAD_PAGE } from './app-update';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from './testing/test-device-store';
import { UpdatePrompt } from './update-prompt';

async function setUp(server: FakeSyncServer) {
  localStorage.clear();
  const versionUpdates = new Subject<VersionEvent>();
  const reloads: number[] = [];
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders(blankRoutes('', 'sync')),
      ...provideTestDeviceStore(server, new FakeBrowserStorage()),
      { provide: SwUpdate, useValue: { isEnabled: true, versionUpdates, unrecoverable: NEVER, checkForUpdate: async () => false } },
      { provide: RELOAD_PAGE, useValue: () => reloads.push(Date.now()) },
    ],
  });
  const store = await startSignedIn(firstOfficial);
  TestBed.inject(AppUpdate).start();
  const fixture = TestBed.createComponent(UpdatePrompt);
  const element = fixture.nativeElement as HTMLElement;
  const button = () => {
    fixture.detectChanges();
    return element.querySelector<HTMLButtonElement>('button');
  };
  const newVersionReady = () =>
    versionUpdates.next({ type: 'VERSION_READY', currentVersion: { hash: 'old' }, latestVersion: { hash: 'new' } });
  return { store, reloads, button, newVersionReady };
}

describe('UpdatePrompt', () => {
  it('when a new version is ready while a record is only on this device, then the button says why it waits and never reloads', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store, reloads, button, newVersionReady } = await setUp(server);
    await store.createRecord('start-check', competitionId, 'start', startCheck(11));
    newVersionReady();

    await until(() => button()?.textContent?.includes('sync first: 1 record only on this device') ?? false, 'the wait is explained');
    expect(button()?.disabled).toBe(true);
    button()!.click();
    expect(TestBed.inject(AppUpdate).updateNow()).toBe(false);
    expect(reloads).toEqual([]);

    server.outage = null;
    await store.syncNow();
    await until(() => button()?.textContent?.trim() === 'Update now', 'the update may go');
    button()!.click();
    expect(reloads).toHaveLength(1);
  });

  it('when a check is open on a screen, then the update waits for it even with nothing to send', async () => {
    const { store, reloads, button, newVersionReady } = await setUp(new FakeSyncServer());
    store.openChecks.set(1);
    newVersionReady();

    await until(() => button()?.textContent?.includes('finish the open check first') ?? false, 'the wait is explained');
    expect(TestBed.inject(AppUpdate).updateNow()).toBe(false);
    expect(reloads).toEqual([]);

    store.openChecks.set(0);
    await until(() => button()?.disabled === false, 'the update may go');
    button()!.click();
    expect(reloads).toHaveLength(1);
  });

  it('when no new version has arrived, then nothing is offered', async () => {
    const { button } = await setUp(new FakeSyncServer());
    expect(button()).toBeNull();
    expect(TestBed.inject(AppUpdate).updateNow()).toBe(false);
  });
});
