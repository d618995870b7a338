import type { Locator, Page } from 'playwright-core';

/** The control steel screen's reading keypad (the mounting checklist above it has keypads of its own). */
export const controlReadingKeypad = (page: Page): Locator => page.locator('[data-section="control-pad"] rl-glove-keypad');

/**
 * Keys a value on a glove keypad (the screen's first one unless named): digits, '.' for the point and '-'
 * for the ± key, e.g. '-4.9'.
 */
export async function keyIn(page: Page, value: string, keypad: Locator = page.locator('rl-glove-keypad').first()): Promise<void> {
  for (const key of value) {
    if (key === '-') await keypad.getByRole('button', { name: 'Change the sign, plus or minus' }).click();
    else if (key === '.') await keypad.getByRole('button', { name: 'Decimal point' }).click();
    else await keypad.getByRole('button', { name: key, exact: true }).click();
  }
}
