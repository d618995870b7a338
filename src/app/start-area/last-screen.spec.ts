import { Component, inject } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { appTestProviders, BlankPage } from '../testing/app-test-providers';
import { LastScreen } from './last-screen';

@Component({ template: '<p>entry</p>' })
class EntryScreen {
  constructor() {
    inject(LastScreen).rememberWhileShown();
  }
}

const entryUrl = '/competitions/0193a5c0-0000-7000-8000-0000000000a1/start/control-steel';

function setUp() {
  TestBed.configureTestingModule({
    providers: appTestProviders([
      { path: '', component: BlankPage },
      { path: 'sync', component: BlankPage },
      { path: 'competitions/:id/start/control-steel', component: EntryScreen },
    ]),
  });
  return { router: TestBed.inject(Router), lastScreen: TestBed.inject(LastScreen) };
}

describe('LastScreen', () => {
  beforeEach(() => localStorage.clear());

  it('when the app is killed on an entry screen, then the next start on the home screen opens it again', async () => {
    const { lastScreen } = setUp();
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(entryUrl, EntryScreen);
    expect(lastScreen.toRestore()).toBe(entryUrl);

    // Killed: the screen never closes the usual way (tearing the test down would close it, so keep what a kill leaves).
    const leftBehind = localStorage.getItem('rimelog.last-entry-screen');
    TestBed.resetTestingModule();
    localStorage.setItem('rimelog.last-entry-screen', leftBehind!);
    const next = setUp();
    await next.router.navigateByUrl('/');
    expect(await next.lastScreen.restoreAtStart()).toBe(true);
    expect(next.router.url).toBe(entryUrl);
  });

  it('when the official leaves the entry screen the usual way, then nothing is reopened', async () => {
    const { lastScreen } = setUp();
    const harness = await RouterTestingHarness.create();
    await harness.navigateByUrl(entryUrl, EntryScreen);
    expect(lastScreen.toRestore()).toBe(entryUrl);
    await harness.navigateByUrl('/sync');
    expect(lastScreen.toRestore()).toBeNull();
  });

  it('when the app starts on another address, or the kept screen is older than 12 hours, then it stays where it is', async () => {
    const { router, lastScreen } = setUp();
    await router.navigateByUrl('/sync');
    localStorage.setItem('rimelog.last-entry-screen', JSON.stringify({ url: entryUrl, at: Date.now() }));
    expect(await lastScreen.restoreAtStart()).toBe(false);
    expect(router.url).toBe('/sync');
    expect(lastScreen.toRestore(Date.now() + 13 * 60 * 60_000)).toBeNull();
  });
});
