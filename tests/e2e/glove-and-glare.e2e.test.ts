import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/ops/demo-users';
import { useServerAndBrowser } from '../support/e2e-fixture';

const fixture = useServerAndBrowser();

async function openHome(): Promise<Page> {
  const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 }, serviceWorkers: 'block' });
  const page = await context.newPage();
  await page.goto(fixture.server.url);
  await page.locator('td.mat-column-name').first().waitFor();
  return page;
}

interface Box {
  label: string;
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Every button, and every link drawn as a button, that is on the screen. */
async function buttonBoxes(page: Page): Promise<Box[]> {
  return page.locator('button, a.mat-mdc-button-base').evaluateAll((buttons) =>
    buttons
      .map((b) => {
        const r = b.getBoundingClientRect();
        return { label: b.textContent?.trim().replace(/\s+/g, ' ') ?? '', x: r.x, y: r.y, width: r.width, height: r.height };
      })
      .filter((box) => box.width > 0 && box.height > 0),
  );
}

function expectGloveSized(boxes: Box[]): void {
  for (const box of boxes) {
    expect(box.height, `${box.label} height`).toBeGreaterThanOrEqual(64);
    expect(box.width, `${box.label} width`).toBeGreaterThanOrEqual(64);
  }
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      expect(gapBetween(boxes[i]!, boxes[j]!), `${boxes[i]!.label} to ${boxes[j]!.label}`).toBeGreaterThanOrEqual(12);
    }
  }
}

async function signedInPage(email: string): Promise<Page> {
  const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 }, serviceWorkers: 'block' });
  const page = await context.newPage();
  await page.goto(`${fixture.server.url}/sign-in`);
  await page.locator('input[name=email]').fill(email);
  await page.locator('input[name=password]').fill(demoPassword);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname === '/');
  await page.locator('td.mat-column-name').first().waitFor();
  return page;
}

/** Smallest distance between the edges of two boxes (0 when they touch or overlap). */
function gapBetween(a: Box, b: Box): number {
  const dx = Math.max(0, Math.max(a.x, b.x) - Math.min(a.x + a.width, b.x + b.width));
  const dy = Math.max(0, Math.max(a.y, b.y) - Math.min(a.y + a.height, b.y + b.height));
  return Math.hypot(dx, dy);
}

/** WCAG 2.x contrast ratio of a text element against the first opaque background behind it. */
async function contrastOf(page: Page, selector: string): Promise<number> {
  return page.locator(selector).first().evaluate((element) => {
    const parse = (css: string) => {
      const m = css.match(/rgba?\(([^)]+)\)/);
      if (!m) throw new Error(`unreadable colour ${css}`);
      const [r, g, b, a = 1] = m[1]!.split(/[ ,/]+/).filter(Boolean).map(Number);
      return { r: r!, g: g!, b: b!, a };
    };
    const luminance = ({ r, g, b }: { r: number; g: number; b: number }) => {
      const lin = (c: number) => {
        const s = c / 255;
        return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
      };
      return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
    };
    let node: Element | null = element;
    let background = { r: 255, g: 255, b: 255, a: 1 };
    while (node) {
      const bg = parse(getComputedStyle(node).backgroundColor);
      if (bg.a === 1) {
        background = bg;
        break;
      }
      node = node.parentElement;
    }
    const text = luminance(parse(getComputedStyle(element).color));
    const back = luminance(background);
    return (Math.max(text, back) + 0.05) / (Math.min(text, back) + 0.05);
  });
}

describe('glove-first targets (WCAG 2.2 SC 2.5.5: at least 44 x 44 CSS px; ours: 64 px, 12 px apart)', () => {
  it('when the home screen shows, then every button is at least 64 px tall and 12 px from the next', async () => {
    const page = await openHome();
    const boxes = await buttonBoxes(page);
    expect(boxes.map((b) => b.label)).toEqual(['Dark screen', 'Sign in', 'Refresh list', 'Rules']);
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
