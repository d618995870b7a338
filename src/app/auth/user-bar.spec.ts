// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { FakeSyncServer } from '../core/device-store/testing/fake-sync-server';
import { competitionId, startCheck } from '../core/device-store/testing/test-device';
import { DeviceStore } from '../core/sync/device-store';
import { FakeBrowserStorage, provideTestDeviceStore, startSignedIn, until } from '../core/sync/testing/test-device-store';
import { appTestProviders, blankRoutes } from '../testing/app-test-providers';
import { AuthStore } from './auth-store';
import { firstOfficial } from './testing/auth-fixtures';
import { UserBar } from './user-bar';

/** The user bar of a signed-in official; the device store runs unless `storeStarted` is false. */
async function setUp({ server = new FakeSyncServer(), storeStarted = true } = {}) {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: [...appTestProviders(blankRoutes('', 'sync', 'sign-in')), ...provideTestDeviceStore(server, new FakeBrowserStorage())],
  });
  if (storeStarted) await startSignedIn(firstOfficial);
  else TestBed.inject(AuthStore).adoptSession(firstOfficial);
  const fixture = TestBed.createComponent(UserBar);
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const text = (selector: string) => {
    fixture.detectChanges();
    return element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  const control = (label: string) => {
    fixture.detectChanges();
    return [...element.querySelectorAll<HTMLElement>('button, a')].find((b) => b.textContent?.trim() === label) ?? null;
  };
  const press = (label: string) => {
    const found = control(label);
    if (!found) throw new Error(`No button or link "${label}"`);
    if (found instanceof HTMLButtonElement && found.disabled) throw new Error(`"${label}" is disabled`);
    found.click();
    fixture.detectChanges();
  };
  return { store: TestBed.inject(DeviceStore), element, text, control, press, router: TestBed.inject(Router), http: TestBed.inject(HttpTestingController) };
}

describe('UserBar', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when records wait on this device and the sign-out choices open, then it warns with their number and points to the sync screen', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store, text, control, press, router } = await setUp({ server });
    await store.createRecord('start-check', competitionId, 'start', startCheck(3));
    await until(() => store.pendingCount() === 1, 'the record is counted');

    press('Sign out ▾');
    expect(text('[data-section="unsent"]')).toBe(
      '⚠ 1 record is only on this device. They stay here and are sent when someone signs in again — sync first if you can.',
    );

    await store.createRecord('start-check', competitionId, 'start', startCheck(4));
    await until(() => text('[data-section="unsent"]').startsWith('⚠ 2 records are only on this device.'), 'the count follows the outbox');

    expect(control('Open the sync screen')?.getAttribute('href')).toBe('/sync');
    press('Open the sync screen');
    await until(() => router.url === '/sync', 'the sync screen opens');
    expect(control('Sign out on this device')).toBeNull();
  });

  it('when records wait and the official signs out anyway, then signing out works and the records stay in the outbox', async () => {
    const server = new FakeSyncServer();
    server.outage = 'unreachable';
    const { store, press, control, router, http } = await setUp({ server });
    await store.createRecord('start-check', competitionId, 'start', startCheck(5));
    await until(() => store.pendingCount() === 1, 'the record is counted');

    press('Sign out ▾');
    expect(control('Sign out on this device')?.hasAttribute('disabled')).toBe(false);
    press('Sign out on this device');
    http.expectOne('/api/auth/sign-out').flush(null);

    await until(() => router.url === '/sign-in', 'the sign-in screen opens');
    expect(TestBed.inject(AuthStore).isSignedIn()).toBe(false);
    const backup = await store.exportBackup();
    expect(backup.opCount).toBe(1);
    expect(store.pendingCount()).toBe(1);

    // The next official to sign in sends it.
    server.outage = null;
    TestBed.inject(AuthStore).adoptSession(firstOfficial);
    await until(() => store.pendingCount() === 0, 'the record is sent after signing in again');
    expect(server.received.map((op) => op.fields['bib'])).toEqual([5]);
  });

  it('when nothing waits on this device, then the sign-out choices carry no warning', async () => {
    const { element, control, press } = await setUp();
    press('Sign out ▾');
    expect(control('Sign out on this device')).not.toBeNull();
    expect(element.querySelector('[data-section="unsent"]')).toBeNull();
    expect(control('Open the sync screen')).toBeNull();
  });

  it('when it is not known yet whether records wait, then it says it is checking and signing out stays possible', async () => {
    const { text, control, press } = await setUp({ storeStarted: false });
    press('Sign out ▾');
    expect(text('[data-section="unsent"]')).toBe('Checking whether records on this device still wait to be sent…');
    expect(control('Open the sync screen')).toBeNull();
    expect(control('Sign out on this device')?.hasAttribute('disabled')).toBe(false);
  });
});
