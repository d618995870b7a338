import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { signInInBrowser } from '../support/browser-sign-in';
import { useServerAndBrowser } from '../support/e2e-fixture';
import { controlReadingKeypad, keyIn } from '../support/glove-keypad-keys';
import { buttonBoxes, expectGloveSized, type Box } from '../support/glove-checks';

// Every start-area screen, in both themes, through axe-core (WCAG 2.x A and AA, plus the 7:1 text
// contrast of AAA) and our own glove measures: 64 px targets 12 px apart, keypad keys at least 15 mm.

const fixture = useServerAndBrowser();
const naturalRace = '0193a5c0-0000-7000-8000-000000000001';
const artificialRace = '0193a5c0-0000-7000-8000-000000000003';
const startArea = (path: string, competitionId = naturalRace) => `${fixture.server.url}/competitions/${competitionId}/start/${path}`;

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
const wcagTags = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];
/** CSS fixes 1 mm at 96/25.4 px, so 15 mm is about 56.7 CSS px. */
const fifteenMm = (15 * 96) / 25.4;

interface AxeFinding {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string; summary: string }[];
}

interface AxeOutcome {
  violations: AxeFinding[];
  /** Every rule axe ran, whatever its result: proves the 7:1 rule was not silently left out. */
  ranRules: string[];
}

async function runAxe(page: Page): Promise<AxeOutcome> {
  // page.evaluate goes through the DevTools protocol, so the server's CSP (no inline scripts) does not apply.
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(axeSource);
  return page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: typeof import('axe-core') }).axe;
    const results = await axe.run(document, {
      runOnly: { type: 'tag', values: tags },
      rules: { 'color-contrast-enhanced': { enabled: true } },
    });
    const findings = (list: typeof results.violations) =>
      list.map((rule) => ({
        id: rule.id,
        impact: rule.impact ?? null,
        help: rule.help,
        nodes: rule.nodes.map((node) => ({ target: node.target.join(' '), summary: node.failureSummary ?? '' })),
      }));
    return {
      violations: findings(results.violations),
      ranRules: [...results.passes, ...results.violations, ...results.incomplete, ...results.inapplicable].map((rule) => rule.id),
    };
  }, wcagTags);
}

function describeViolations(violations: AxeFinding[]): string {
  return violations
    .map((v) => `${v.id} (${v.impact}): ${v.help}\n${v.nodes.map((n) => `    ${n.target}\n      ${n.summary.replace(/\n/g, '\n      ')}`).join('\n')}`)
    .join('\n');
}

async function keypadKeyBoxes(page: Page): Promise<Box[]> {
  return page.locator('rl-glove-keypad .key').evaluateAll((keys) =>
    keys.map((key) => {
      const r = key.getBoundingClientRect();
      return { label: key.getAttribute('aria-label') ?? key.textContent?.trim() ?? '', x: r.x, y: r.y, width: r.width, height: r.height };
    }),
  );
}

async function signedIn(theme: 'glare' | 'dark'): Promise<Page> {
  const context = await fixture.browser.newContext({ viewport: { width: 412, height: 915 }, serviceWorkers: 'block' });
  const page = await context.newPage();
  await signInInBrowser(page, fixture.server.url, 'start-official@frostbarrow.test');
  if (theme === 'dark') await page.getByRole('button', { name: 'Dark screen' }).click();
  expect(await page.evaluate(() => document.documentElement.className)).toContain(`theme-${theme}`);
  return page;
}

// Bibs 41 and up are not on the demo start lists; bibs from 1 are, so their steps can be judged.
let nextBib = 41;
const nextListedBib: Record<string, number> = { [naturalRace]: 1, [artificialRace]: 1 };
async function beginCheck(page: Page, competitionId = naturalRace, bib = nextBib++): Promise<number> {
  await page.goto(startArea('checks', competitionId));
  await page.locator('input[name=bib]').fill(String(bib));
  await page.getByRole('button', { name: 'Begin check' }).click();
  await page.getByRole('heading', { name: `Run 1 · Bib ${bib}` }).waitFor();
  return bib;
}

/** Begins a check of a sled on the start list, so its steps can be judged. */
async function beginListedCheck(page: Page, competitionId = naturalRace): Promise<number> {
  const bib = nextListedBib[competitionId]!;
  nextListedBib[competitionId] = bib + 1;
  return beginCheck(page, competitionId, bib);
}

/** Begins a check of a sled on the start list and shows one of its steps. */
async function showStep(page: Page, competitionId: string, step: string, shown: string): Promise<void> {
  await beginListedCheck(page, competitionId);
  await page.locator(`button[data-step="${step}"]`).click();
  await page.locator(shown).first().waitFor();
}

interface Screen {
  name: string;
  hasKeypad: boolean;
  open(page: Page): Promise<void>;
}

const screens: Screen[] = [
  {
    name: 'control steel, before the first reading',
    hasKeypad: true,
    async open(page) {
      await page.goto(startArea('control-steel'));
      await page.locator('[data-section="countdown"] [data-state]').waitFor();
      await controlReadingKeypad(page).waitFor();
    },
  },
  {
    name: 'control steel, a value out of range typed instead of keyed',
    hasKeypad: true,
    async open(page) {
      await page.goto(startArea('control-steel'));
      const keypad = controlReadingKeypad(page);
      await keypad.waitFor();
      await keyIn(page, '99', keypad);
      await keypad.getByRole('button', { name: 'Type instead' }).click();
      await keypad.locator('input').waitFor();
      await keypad.locator('.problem .mark').waitFor();
    },
  },
  {
    name: 'control steel, a reading saved and its correction open',
    hasKeypad: true,
    async open(page) {
      await page.goto(startArea('control-steel'));
      const keypad = controlReadingKeypad(page);
      await keypad.waitFor();
      await page.locator('[data-section="control-pyrometer"] button[data-instrument="PYR-01"]').click();
      await keyIn(page, '-4.9', keypad);
      await keypad.getByRole('button', { name: 'Save', exact: true }).click();
      await page.getByRole('status').filter({ hasText: 'Saved on this device' }).waitFor();
      await page.getByRole('button', { name: /^Correct the .* reading$/ }).first().click();
      await page.locator('[data-section="correction"] rl-glove-keypad').waitFor();
    },
  },
  {
    name: 'start checks, with a check begun',
    hasKeypad: false,
    async open(page) {
      const bib = await beginCheck(page);
      await page.goto(startArea('checks'));
      await page.locator(`[data-check="1-${bib}"]`).waitFor();
    },
  },
  {
    name: 'a start check, referral to the technical delegate asked',
    hasKeypad: false,
    async open(page) {
      await beginCheck(page);
      await page.getByRole('button', { name: '⚑ Refer to the technical delegate' }).click();
      await page.getByRole('group', { name: 'Confirm the result' }).waitFor();
    },
  },
  {
    name: 'a start check, equipment and bib',
    hasKeypad: false,
    open: (page) => showStep(page, naturalRace, 'equipment', 'rl-equipment-step'),
  },
  {
    name: 'a start check, proving the scale',
    hasKeypad: true,
    async open(page) {
      await showStep(page, naturalRace, 'scale-proof', '[data-section="scale"]');
      await page.locator('[data-section="scale"] button[data-instrument="SCL-01"]').click();
      await page.locator('rl-scale-proof-step rl-glove-keypad').waitFor();
    },
  },
  {
    name: 'a start check, weighing the sled (natural track)',
    hasKeypad: true,
    open: (page) => showStep(page, naturalRace, 'weight', 'rl-weight-step rl-glove-keypad'),
  },
  {
    name: 'a start check, dimensions (natural track)',
    hasKeypad: true,
    open: (page) => showStep(page, naturalRace, 'dimensions', 'rl-dimensions-step rl-glove-keypad'),
  },
  {
    name: 'a start check, steel temperatures with a spot chosen',
    hasKeypad: true,
    async open(page) {
      await showStep(page, naturalRace, 'steel', 'rl-steel-temperature-step');
      await page.locator('[data-section="pyrometer"] button[data-instrument="PYR-02"]').click();
      await page.locator('button[data-spot="left-1"]').click();
      await page.locator('rl-steel-temperature-step rl-glove-keypad').waitFor();
    },
  },
  {
    name: 'a start check, weighing the athlete with the sled against the upper bound (artificial track)',
    hasKeypad: true,
    async open(page) {
      await showStep(page, artificialRace, 'weight', 'rl-weight-step rl-glove-keypad');
      await page.locator('[data-section="bound"]').waitFor();
    },
  },
  {
    name: 'a start check, the gap probe (artificial track)',
    hasKeypad: false,
    open: (page) => showStep(page, artificialRace, 'gap-probe', 'rl-gap-probe-step'),
  },
  {
    name: 'control steel on artificial track, with ice and air',
    hasKeypad: true,
    async open(page) {
      await page.goto(startArea('control-steel', artificialRace));
      await page.locator('[data-section="ice"] rl-glove-keypad').waitFor();
    },
  },
  {
    name: 'a start check, cleared to start',
    hasKeypad: false,
    async open(page) {
      await beginListedCheck(page);
      await page.getByRole('button', { name: '✓ Cleared to start' }).click();
      // Steps are still to do on this sled, so clearing it is asked first.
      await page.getByRole('button', { name: 'Yes, cleared to start' }).click();
      await page.getByRole('status').filter({ hasText: 'Cleared to start' }).waitFor();
      await page.getByRole('link', { name: 'Next sled' }).waitFor();
    },
  },
];

describe.each(['glare', 'dark'] as const)('start area in the %s theme', (theme) => {
  it.each(screens)(
    'when $name shows, then axe finds no WCAG A/AA or 7:1 contrast problem, every button is glove-sized and apart, and keypad keys are at least 15 mm',
    async (screen) => {
      const page = await signedIn(theme);
      await screen.open(page);

        const { violations, ranRules } = await runAxe(page);
      expect(ranRules).toEqual(expect.arrayContaining(['color-contrast', 'color-contrast-enhanced', 'target-size', 'label', 'aria-allowed-attr']));
      // Soft, so one run reports the glove measures as well.
      expect.soft(violations, `axe found in "${screen.name}" (${theme}):\n${describeViolations(violations)}`).toEqual([]);

      const boxes = await buttonBoxes(page);
      expect(boxes.length).toBeGreaterThan(2);
      expectGloveSized(boxes);
      const keys = await keypadKeyBoxes(page);
      // Ten digits, the point, backspace, clear and OK; the ± key only where a value may be negative.
      if (screen.hasKeypad) expect(keys.length).toBeGreaterThanOrEqual(14);
      else expect(keys).toEqual([]);
      for (const key of keys) {
        expect(key.width, `${key.label} width`).toBeGreaterThanOrEqual(fifteenMm);
        expect(key.height, `${key.label} height`).toBeGreaterThanOrEqual(fifteenMm);
      }
      await page.context().close();
    },
  );
});
