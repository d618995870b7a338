import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { signInInBrowser } from '../support/browser-sign-in';
import { useServerAndBrowser } from '../support/e2e-fixture';
import { buttonBoxes, contrastOf, expectGloveSized } from '../support/glove-checks';

const fixture = useServerAndBrowser();

async function openHome(): Promise<Page> {
  const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 }, serviceWorkers: 'block' });
  const page = await context.newPage();
  await page.goto(fixture.server.url);
  await page.locator('td.mat-column-name').first().waitFor();
  return page;
}

async function signedInPage(email: string): Promise<Page> {
  const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 }, serviceWorkers: 'block' });
  const page = await context.newPage();
  await signInInBrowser(page, fixture.server.url, email);
  await page.locator('td.mat-column-name').first().waitFor();
  return page;
}

describe('glove-first targets (WCAG 2.2 SC 2.5.5: at least 44 x 44 CSS px; ours: 64 px, 12 px apart)', () => {
  it('when the home screen shows, then every button is at least 64 px tall and 12 px from the next', async () => {
    const page = await openHome();
    const boxes = await buttonBoxes(page);
    expect(boxes.map((b) => b.label)).toEqual(['Dark screen', 'Sign in', 'Refresh list', 'Rules', 'Rules']);
    expectGloveSized(boxes);
    await page.context().close();
  });

  it.each([
    ['/', 'Competitions'],
    ['/competitions/0193a5c0-0000-7000-8000-000000000001/rules', 'Rules in force'],
    ['/switch-official', 'Who is using this device?'],
    ['/set-pin', 'Choose your PIN'],
    ['/sync', 'Sync'],
    ['/competitions/0193a5c0-0000-7000-8000-000000000001/start/control-steel', 'Control steel'],
    ['/competitions/0193a5c0-0000-7000-8000-000000000001/start/checks', 'Start checks'],
  ])('when a signed-in official opens %s, then every button on it is glove-sized and apart', async (path, heading) => {
    const page = await signedInPage('start-official@frostbarrow.test');
    await page.goto(`${fixture.server.url}${path}`);
    await page.getByRole('heading', { name: heading }).first().waitFor();
    const boxes = await buttonBoxes(page);
    expect(boxes.length).toBeGreaterThan(2);
    expectGloveSized(boxes);
    await page.context().close();
  });

  it('when the sign-in screen shows, then its fields and button are glove-sized and its text reaches 7:1', async () => {
    const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 }, serviceWorkers: 'block' });
    const page = await context.newPage();
    await page.goto(`${fixture.server.url}/sign-in`);
    await page.locator('input[name=email]').waitFor();
    expectGloveSized(await buttonBoxes(page));
    // The whole field is the touch target: tapping anywhere in it focuses the input.
    const field = await page.locator('.mat-mdc-text-field-wrapper').first().boundingBox();
    expect(field!.height).toBeGreaterThanOrEqual(56);
    for (const selector of ['h1', 'mat-label', 'button.primary-action .mdc-button__label']) {
      expect(await contrastOf(page, selector), selector).toBeGreaterThanOrEqual(7);
    }
    await context.close();
  });
});

describe('readable in glare and at dusk (WCAG 2.2 SC 1.4.6: text contrast at least 7:1)', () => {
  const textSelectors = ['h1', 'td.mat-column-name', 'th.mat-column-name', '.brand-name', 'rl-field-cautions p', 'button.primary-action .mdc-button__label'];

  it('when the glare theme is on, then body text, table and main action reach 7:1', async () => {
    const page = await openHome();
    expect(await page.evaluate(() => document.documentElement.className)).toContain('theme-glare');
    for (const selector of textSelectors) {
      expect(await contrastOf(page, selector), selector).toBeGreaterThanOrEqual(7);
    }
    await page.context().close();
  });

  it('when the dark screen is chosen, then it stays chosen after a reload and still reaches 7:1', async () => {
    const page = await openHome();
    await page.getByRole('button', { name: 'Dark screen' }).click();
    await page.reload();
    await page.locator('td.mat-column-name').first().waitFor();
    expect(await page.evaluate(() => document.documentElement.className)).toContain('theme-dark');
    expect(await page.getByRole('button', { name: 'Bright screen' }).getAttribute('aria-pressed')).toBe('true');
    for (const selector of textSelectors) {
      expect(await contrastOf(page, selector), selector).toBeGreaterThanOrEqual(7);
    }
    await page.context().close();
  });
});
