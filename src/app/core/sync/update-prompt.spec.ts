// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { SwUpdate, type UnrecoverableStateEvent, type VersionEvent } from '@angular/service-worker';
import { Subject } from 'rxjs';
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
  const unrecoverable = new Subject<UnrecoverableStateEvent>();
  const reloads: number[] = [];
  TestBed.configureTestingModule({
    providers: [
      ...appTestProviders(blankRoutes('', 'sync')),
      ...provideTestDeviceStore(server, new FakeBrowserStorage()),
      { provide: SwUpdate, useValue: { isEnabled: true, versionUpdates, unrecoverable, checkForUpdate: async () => false } },
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
  const appDamaged = (reason: string) => unrecoverable.next({ type: 'UNRECOVERABLE_STATE', reason });
  const text = (selector = ':scope') => {
    fixture.detectChanges();
    return element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  return { store, reloads, button, newVersionReady, appDamaged, element, text };
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
    expect(TestBed.inject(AppUpdate).reloadDamaged()).toBe(false);
  });

  describe('when the app on this device is damaged (the worker cannot serve its files)', () => {
    const reason = 'Failed to retrieve hashed resource from the server. (AssetGroup: app | URL: /chunk-4F2A.js)';

    it('while a record is only on this device, then a lasting notice says the records are safe, the reload is refused and the backup is offered', async () => {
      const server = new FakeSyncServer();
      server.outage = 'unreachable';
      const { store, reloads, button, appDamaged, newVersionReady, element, text } = await setUp(server);
      await store.createRecord('start-check', competitionId, 'start', startCheck(12));
      appDamaged(reason);

      await until(() => text('[data-notice="damaged"]') !== '', 'the notice shows');
      const notice = text('[data-notice="damaged"]');
      expect(notice).toContain('The app on this device is damaged');
      expect(notice).toContain('The records on this device are safe in its storage.');
      expect(notice).toContain('Reload the app when there is a signal.');
      expect(notice).toContain(reason);
      expect(element.querySelector('[data-notice="damaged"]')?.getAttribute('role')).toBe('alert');
      await until(() => button()?.textContent?.includes('Reload waits: sync first: 1 record only on this device') ?? false, 'the wait is explained');
      expect(button()?.disabled).toBe(true);
      button()!.click();
      expect(TestBed.inject(AppUpdate).reloadDamaged()).toBe(false);
      expect(reloads).toEqual([]);

      // A new version arriving as well does not hide the damage.
      newVersionReady();
      expect(text('[data-notice="damaged"]')).toContain('damaged');

      const backup = [...element.querySelectorAll<HTMLAnchorElement>('a')].find((a) => a.textContent?.trim() === 'Export a backup first');
      expect(backup?.getAttribute('href')).toBe('/sync');
      backup!.click();
      const router = TestBed.inject(Router);
      await until(() => router.url === '/sync', 'the sync screen opens');

      server.outage = null;
      await store.syncNow();
      await until(() => button()?.textContent?.trim() === 'Reload the app', 'the reload may go');
      expect(element.querySelector('a')).toBeNull();
      button()!.click();
      expect(reloads).toHaveLength(1);
    });

    it('with nothing waiting but no signal, then the reload waits for one and goes once the server answers', async () => {
      const server = new FakeSyncServer();
      const { store, reloads, button, appDamaged } = await setUp(server);
      server.outage = 'unreachable';
      await store.syncNow();
      appDamaged(reason);

      await until(() => button()?.textContent?.includes('Reload waits: needs a signal to fetch the app again') ?? false, 'the wait is explained');
      expect(button()?.disabled).toBe(true);
      expect(TestBed.inject(AppUpdate).reloadDamaged()).toBe(false);
      expect(reloads).toEqual([]);

      server.outage = null;
      await store.syncNow();
      await until(() => button()?.disabled === false, 'the reload may go');
      expect(button()?.textContent?.trim()).toBe('Reload the app');
      button()!.click();
      expect(reloads).toHaveLength(1);
    });
  });
});
