import type { Page } from 'playwright-core';

/** Keys a value on the screen's first glove keypad: digits, '.' for the point and '-' for the ± key, e.g. '-4.9'. */
export async function keyIn(page: Page, value: string): Promise<void> {
  const keypad = page.locator('rl-glove-keypad').first();
  for (const key of value) {
    if (key === '-') await keypad.getByRole('button', { name: 'Change the sign, plus or minus' }).click();
    else if (key === '.') await keypad.getByRole('button', { name: 'Decimal point' }).click();
    else await keypad.getByRole('button', { name: key, exact: true }).click();
  }
}
