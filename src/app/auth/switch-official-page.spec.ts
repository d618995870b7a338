import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { appTestProviders, blankRoutes } from '../testing/app-test-providers';
import { AuthStore } from './auth-store';
import { DevicePins, pinLockMs } from './device-pins';
import { OfficialSwitch } from './official-switch';
import { makePinVerifier } from './pin-verifier';
import { ServerReachability } from './server-reachability';
import { SwitchOfficialPage } from './switch-official-page';
import { apiError, firstOfficial, secondOfficial } from './testing/auth-fixtures';

const secondsPin = '2468';
// One scrypt check takes a fifth of a second or more; five wrong PINs and a right one need their time.
const slow = 30_000;

async function setUp({ offline }: { offline: boolean }) {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: appTestProviders(blankRoutes('', 'switch-official')),
  });
  const store = TestBed.inject(AuthStore);
  const router = TestBed.inject(Router);
  const http = TestBed.inject(HttpTestingController);
  // The first official signed in at the hut; the second set their PIN on this device there, earlier.
  store.adoptSession(firstOfficial);
  TestBed.inject(DevicePins).save({ ...secondOfficial, hasPin: true }, await makePinVerifier(secondsPin));
  if (offline) TestBed.inject(ServerReachability).state.set('unreachable');
  await router.navigateByUrl('/switch-official');

  const fixture = TestBed.createComponent(SwitchOfficialPage);
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const button = (label: string) =>
    [...element.querySelectorAll<HTMLButtonElement>('button')].find((b) => b.textContent?.trim().startsWith(label));
  const press = (label: string) => {
    const found = button(label);
    if (!found) throw new Error(`No button "${label}"`);
    found.click();
    fixture.detectChanges();
  };
  /** Keys in the PIN and presses Switch, then waits until the PIN has been checked. */
  const enterPin = async (pin: string) => {
    for (const digit of pin) press(digit);
    press('Switch');
    await vi.waitFor(() => {
      if (element.querySelector('[role="status"]')?.textContent?.includes('Checking the PIN')) throw new Error('still checking');
      fixture.detectChanges();
    });
  };
  const alertText = () => element.querySelector('[role="alert"]')?.textContent ?? '';
  return { fixture, element, store, router, http, press, button, enterPin, alertText };
}

describe('SwitchOfficialPage', () => {
  afterEach(() => {
    TestBed.inject(HttpTestingController).verify();
    vi.useRealTimers();
  });

  it('when offline and the right PIN is entered, then the second official uses the device, with no request', async () => {
    const { store, router, press, enterPin } = await setUp({ offline: true });
    press('Second Official');
    await enterPin(secondsPin);

    await vi.waitFor(() => expect(router.url).toBe('/'));
    expect(store.user()?.displayName).toBe('Second Official');
    expect(store.activeUserId()).toBe('official-two');
    // The server session stays the first official's until there is a signal again.
    expect(store.serverUser()?.id).toBe('official-one');
    expect(store.isHandOverPending()).toBe(true);
  }, slow);

  it('when offline and a wrong PIN is entered, then it is refused with the tries left', async () => {
    const { store, router, press, enterPin, alertText } = await setUp({ offline: true });
    press('Second Official');
    await enterPin('1357');

    await vi.waitFor(() => expect(alertText()).toContain('That PIN is not right.'));
    expect(alertText()).toContain('4 tries left before a 5-minute pause');
    expect(store.user()?.displayName).toBe('First Official');
    expect(router.url).toBe('/switch-official');
  }, slow);

  it('when five wrong PINs are entered, then tries stop for five minutes, even the right PIN', async () => {
    const { store, press, button, enterPin, alertText } = await setUp({ offline: true });
    press('Second Official');
    for (let i = 0; i < 5; i++) await enterPin('1111');

    await vi.waitFor(() => expect(alertText()).toContain('Too many wrong PINs for Second Official.'));
    expect(button('2')?.disabled).toBe(true);

    const officialSwitch = TestBed.inject(OfficialSwitch);
    expect((await officialSwitch.switchTo('official-two', secondsPin)).kind).toBe('locked');
    expect(store.user()?.displayName).toBe('First Official');

    // The lock is kept on the device and ends after five minutes.
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(Date.now() + pinLockMs + 1000);
    expect((await officialSwitch.switchTo('official-two', secondsPin)).kind).toBe('switched');
    expect(store.user()?.displayName).toBe('Second Official');
  }, slow);

  it('when online, then the server checks the PIN and its session follows the switch', async () => {
    const { store, router, http, press } = await setUp({ offline: false });
    http.expectOne('/api/auth/device-users').flush({ users: [{ id: 'official-two', displayName: 'Second Official' }] });
    press('Second Official');
    for (const digit of secondsPin) press(digit);
    press('Switch');

    const request = await vi.waitFor(() => http.expectOne('/api/auth/switch'));
    expect(request.request.body).toEqual({ userId: 'official-two', pin: secondsPin });
    request.flush({ ...secondOfficial, hasPin: true });
    await vi.waitFor(() => expect(router.url).toBe('/'));
    expect(store.user()?.displayName).toBe('Second Official');
    expect(store.isHandOverPending()).toBe(false);
  }, slow);

  it('when online and the server refuses the PIN, then it counts as a wrong try', async () => {
    const { store, http, press, alertText } = await setUp({ offline: false });
    http.expectOne('/api/auth/device-users').flush({ users: [{ id: 'official-two', displayName: 'Second Official' }] });
    press('Second Official');
    for (const digit of '9999') press(digit);
    press('Switch');

    (await vi.waitFor(() => http.expectOne('/api/auth/switch'))).flush(
      apiError('unauthenticated', 'That PIN is not right for this official on this device.'),
      { status: 401, statusText: 'Unauthorized' },
    );
    // A 401 could also mean the device's own session ended: the store asks, and it has not.
    (await vi.waitFor(() => http.expectOne('/api/auth/me'))).flush(firstOfficial);
    await vi.waitFor(() => expect(alertText()).toContain('4 tries left'));
    expect(store.user()?.displayName).toBe('First Official');
  }, slow);

  it('when nobody else set a PIN here, then it says how to set one', async () => {
    const { element, http } = await setUp({ offline: false });
    TestBed.inject(DevicePins).remove('official-two');
    http.expectOne('/api/auth/device-users').flush({ users: [{ id: 'official-one', displayName: 'First Official' }] });
    await vi.waitFor(() => expect(element.textContent).toContain('No other official has set a PIN on this device yet.'));
  });
});
