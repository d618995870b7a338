import { describe, expect, it } from 'vitest';
import { demoCompetitions } from '../../server/ops/demo-scenario';
import { useServerAndBrowser } from '../support/e2e-fixture';

const fixture = useServerAndBrowser();

describe('the app shell offline', () => {
  it('when loaded once with the server up, then it reopens with the server gone and no network', async () => {
    const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 } });
    const page = await context.newPage();
    await page.goto(fixture.server.url);

    // The demo list comes from PostgreSQL through the API into the Material table.
    await page.locator('td.mat-column-name').first().waitFor();
    const names = (await page.locator('td.mat-column-name').allTextContents()).map((n) => n.trim());
    const expected = [...demoCompetitions]
      .sort((a, b) => a.firstRunOn.localeCompare(b.firstRunOn))
      .map((c) => c.name);
    expect(names).toEqual(expected);

    await page.locator('rl-offline-badge[data-state="ready"]').waitFor({ timeout: 60_000 });
    expect(await page.locator('rl-offline-badge').textContent()).toContain('Ready offline');
    const controlled = await page.evaluate(async () => {
      const registration = await navigator.serviceWorker.ready;
      return navigator.serviceWorker.controller !== null && registration.active !== null;
    });
    expect(controlled).toBe(true);

    await fixture.server.stop();
    await context.setOffline(true);
    const reloaded = await page.reload();
    expect(reloaded?.fromServiceWorker()).toBe(true);

    await page.getByRole('heading', { name: 'Competitions' }).waitFor();
    expect((await page.locator('.brand-name').textContent())?.trim()).toBe('Rimelog');
    await page.getByRole('alert').waitFor();
    expect(await page.getByRole('alert').textContent()).toContain('cannot be reached from this device');
    await page.locator('rl-offline-badge[data-state="ready"]').waitFor();
    // The self-hosted font came from the worker's cache too.
    const fontLoaded = await page.evaluate(async () => {
      await document.fonts.ready;
      return document.fonts.check('700 18px "Atkinson Hyperlegible"');
    });
    expect(fontLoaded).toBe(true);
    await context.close();
  });
});
