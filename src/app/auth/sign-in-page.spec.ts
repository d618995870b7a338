import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatInputHarness } from '@angular/material/input/testing';
import { appTestProviders, blankRoutes } from '../testing/app-test-providers';
import { AuthStore } from './auth-store';
import { SignInPage } from './sign-in-page';
import { apiError, firstOfficial } from './testing/auth-fixtures';

/** Waits until the page shows an element: a request's answer reaches the page a few promises later. */
function appears(element: HTMLElement, selector: string): Promise<Element> {
  return vi.waitFor(() => {
    const found = element.querySelector(selector);
    if (!found) throw new Error(`${selector} has not appeared yet`);
    return found;
  });
}

async function setUp(returnUrl?: string) {
  localStorage.clear();
  TestBed.configureTestingModule({
    providers: appTestProviders(blankRoutes('', 'competitions/:id/rules')),
  });
  const fixture = TestBed.createComponent(SignInPage);
  if (returnUrl) fixture.componentRef.setInput('returnUrl', returnUrl);
  await fixture.whenStable();
  const harnesses = TestbedHarnessEnvironment.loader(fixture);
  const element = fixture.nativeElement as HTMLElement;
  const fill = async (label: string, value: string) =>
    (await harnesses.getHarness(MatInputHarness.with({ selector: `[name="${label}"]` }))).setValue(value);
  const submit = () => {
    // Click directly: the harness would wait for stability, which the sign-in request holds off.
    (element.querySelector('button[type="submit"]') as HTMLButtonElement).click();
    TestBed.tick();
  };
  return { fixture, element, fill, submit, http: TestBed.inject(HttpTestingController) };
}

describe('SignInPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when the official signs in, then the form is posted with this device and they go back where they were going', async () => {
    const returnUrl = '/competitions/0193a5c0-0000-7000-8000-0000000000a1/rules';
    const { fixture, fill, submit, http } = await setUp(returnUrl);
    await fill('email', '  First.Official@Example.test ');
    await fill('password', 'a long enough secret');
    submit();

    const request = http.expectOne('/api/auth/sign-in');
    expect(request.request.method).toBe('POST');
    const store = TestBed.inject(AuthStore);
    expect(request.request.body).toEqual({ email: 'First.Official@Example.test', password: 'a long enough secret', deviceId: store.deviceId });
    request.flush(firstOfficial);
    await vi.waitFor(() => expect(TestBed.inject(Router).url).toBe(returnUrl));

    // The device-users list is fetched for the switch screen once signed in.
    http.expectOne('/api/auth/device-users').flush({ users: [] });
    await fixture.whenStable();
    expect(store.user()?.displayName).toBe('First Official');
  });

  it('when the server answers 401, then its message is shown in words and nobody is signed in', async () => {
    const { element, fill, submit, http } = await setUp();
    await fill('email', 'first.official@example.test');
    await fill('password', 'not the password');
    submit();
    http
      .expectOne('/api/auth/sign-in')
      .flush(apiError('unauthenticated', 'The e-mail address or the password is not right.'), { status: 401, statusText: 'Unauthorized' });
    const alert = await appears(element, '[role="alert"]');
    expect(alert.textContent).toContain('Not signed in.');
    expect(alert.textContent).toContain('The e-mail address or the password is not right.');
    expect(TestBed.inject(AuthStore).isSignedIn()).toBe(false);
    expect(TestBed.inject(Router).url).toBe('/');
  });

  it('when the e-mail address is not one, then it says so and sends nothing', async () => {
    const { fixture, element, fill, submit } = await setUp();
    await fill('email', 'first.official');
    await fill('password', 'whatever');
    submit();
    await fixture.whenStable();
    expect(element.querySelector('[role="alert"]')?.textContent).toContain('Enter a valid e-mail address');
    TestBed.inject(HttpTestingController).expectNone('/api/auth/sign-in');
  });

  it('when there is no signal, then it says the server cannot be reached', async () => {
    const { element, fill, submit, http } = await setUp();
    await fill('email', 'first.official@example.test');
    await fill('password', 'a long enough secret');
    submit();
    http.expectOne('/api/auth/sign-in').error(new ProgressEvent('error'), { status: 0 });
    const alert = await appears(element, '[role="alert"]');
    expect(alert.textContent).toContain('cannot be reached from this device');
  });
});
