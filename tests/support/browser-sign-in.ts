import type { Page } from 'playwright-core';
import { demoPassword } from '../../server/ops/demo-users';

/** Signs a demo user in through the sign-in screen and waits for the home screen. */
export async function signInInBrowser(page: Page, serverUrl: string, email: string): Promise<void> {
  await page.goto(`${serverUrl}/sign-in`);
  await page.locator('input[name=email]').fill(email);
  await page.locator('input[name=password]').fill(demoPassword);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname === '/');
}
