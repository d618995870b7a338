import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { appTestProviders } from '../testing/app-test-providers';
import { keepScreenAwake } from './screen-awake';

@Component({ template: '<p>{{ awake() }}</p>' })
class EntryScreen {
  readonly awake = keepScreenAwake();
}

class FakeWakeLock {
  requests = 0;
  refuse = false;
  readonly sentinels: { released: boolean; release: () => Promise<void> }[] = [];
  async request(): Promise<unknown> {
    this.requests++;
    if (this.refuse) throw new DOMException('Battery saver is on', 'NotAllowedError');
    const sentinel = {
      released: false,
      release: async () => {
        sentinel.released = true;
      },
    };
    this.sentinels.push(sentinel);
    return sentinel;
  }
}

function withWakeLock(fake: FakeWakeLock | undefined): void {
  Object.defineProperty(navigator, 'wakeLock', { value: fake, configurable: true });
}

const settle = () => new Promise((resolve) => setTimeout(resolve, 0));

describe('keepScreenAwake', () => {
  afterEach(() => withWakeLock(undefined));

  it('when an entry screen shows, then the screen is kept on, and let go when the screen closes', async () => {
    const fake = new FakeWakeLock();
    withWakeLock(fake);
    TestBed.configureTestingModule({ providers: appTestProviders() });
    const fixture = TestBed.createComponent(EntryScreen);
    await settle();
    expect(fixture.componentInstance.awake()).toBe('on');

    fixture.destroy();
    await settle();
    expect(fake.sentinels.map((s) => s.released)).toEqual([true]);
  });

  it('when the browser refuses or has no wake lock, then the state says so and nothing fails', async () => {
    const fake = new FakeWakeLock();
    fake.refuse = true;
    withWakeLock(fake);
    TestBed.configureTestingModule({ providers: appTestProviders() });
    const refused = TestBed.createComponent(EntryScreen);
    await settle();
    expect(refused.componentInstance.awake()).toBe('refused');

    withWakeLock(undefined);
    expect(TestBed.createComponent(EntryScreen).componentInstance.awake()).toBe('not-supported');
  });
});
