import type { Browser } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { launchChromium } from './browser';
import { startServerWithDemo, type RunningServer } from './running-server';

export interface E2eFixture {
  readonly server: RunningServer;
  readonly browser: Browser;
}

/** One real server with the demo scenario and one Chromium for the test file; both gone afterwards. */
export function useServerAndBrowser(): E2eFixture {
  let server: RunningServer | undefined;
  let browser: Browser | undefined;
  beforeAll(async () => {
    server = await startServerWithDemo();
    browser = await launchChromium();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
    await server?.database.drop();
  });
  return {
    get server() {
      if (!server) throw new Error('The server is not started yet (use it inside a test).');
      return server;
    },
    get browser() {
      if (!browser) throw new Error('The browser is not launched yet (use it inside a test).');
      return browser;
    },
  };
}
