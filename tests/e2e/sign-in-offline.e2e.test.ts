import type { BrowserContext, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/ops/demo-users';
import { signInInBrowser } from '../support/browser-sign-in';
import { useServerAndBrowser } from '../support/e2e-fixture';

const fixture = useServerAndBrowser();
const phone = { viewport: { width: 412, height: 915 } };
const headerText = async (page: Page) => (await page.locator('header').textContent())?.replace(/\s+/g, ' ') ?? '';

const signIn = (page: Page, email: string) => signInInBrowser(page, fixture.server.url, email);

async function keyPin(page: Page, pin: string): Promise<void> {
  for (const digit of pin) await page.locator('rl-pin-pad button', { hasText: new RegExp(`^\\s*${digit}\\s*$`) }).click();
}

async function setPin(page: Page, pin: string): Promise<void> {
  await page.goto(`${fixture.server.url}/set-pin`);
  await page.locator('input[name=password]').fill(demoPassword);
  await keyPin(page, pin);
  await page.getByRole('button', { name: 'Next' }).click();
  await keyPin(page, pin);
  await page.getByRole('button', { name: 'Set my PIN' }).click();
  await page.getByText('Your PIN is set for this device.').waitFor();
}

const meStatus = (context: BrowserContext) => context.request.get(`${fixture.server.url}/api/auth/me`).then((r) => r.status());

describe('signed in at the hut, working on the mountain', () => {
  it('when an official signs in, goes offline and reloads, then they are still themselves; a second official takes over by PIN offline', async () => {
    const context = await fixture.browser.newContext(phone);
    const page = await context.newPage();
    await signIn(page, 'start-official-2@frostbarrow.test');
    await setPin(page, '2580');
    await signIn(page, 'start-official@frostbarrow.test');
    await page.locator('rl-offline-badge[data-state="ready"]').waitFor({ timeout: 60_000 });

    await context.setOffline(true);
    await page.reload();
    await page.locator('header').getByText('Pim Aldous').waitFor();
    expect(await headerText(page)).toContain('Official');

    await page.getByRole('link', { name: 'Switch official' }).click();
    await page.getByRole('button', { name: /Kaja Brenn/ }).click();
    await keyPin(page, '1111');
    await page.getByRole('button', { name: 'Switch', exact: true }).click();
    await expect.poll(() => page.getByRole('alert').textContent()).toMatch(/PIN/);
    await page.screenshot({ path: 'test-results/switch-wrong-pin.png', fullPage: true });
    await keyPin(page, '2580');
    await page.getByRole('button', { name: 'Switch', exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/');
    await page.locator('header').getByText('Kaja Brenn').waitFor();
    expect(await headerText(page)).not.toContain('Pim Aldous');
    await context.close();
  });

  it('when the browser is closed and opened again within the session, then the official is still signed in; sign-out everywhere ends every device', async () => {
    const firstContext = await fixture.browser.newContext(phone);
    const first = await firstContext.newPage();
    await signIn(first, 'start-leader@frostbarrow.test');
    const saved = await firstContext.storageState();
    await firstContext.close();

    const reopened = await fixture.browser.newContext({ ...phone, storageState: saved });
    const page = await reopened.newPage();
    await page.goto(fixture.server.url);
    await page.locator('header').getByText('Runa Holt').waitFor();
    expect(await meStatus(reopened)).toBe(200);

    const tabletContext = await fixture.browser.newContext(phone);
    const tablet = await tabletContext.newPage();
    await signIn(tablet, 'start-leader@frostbarrow.test');
    expect(await meStatus(tabletContext)).toBe(200);

    await page.getByRole('button', { name: /Sign out/ }).click();
    await page.getByRole('button', { name: /Sign out everywhere/ }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    expect(await meStatus(reopened)).toBe(401);
    expect(await meStatus(tabletContext)).toBe(401);
    await reopened.close();
    await tabletContext.close();
  });
});
