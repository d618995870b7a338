import type { BrowserContext, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { signInInBrowser } from '../support/browser-sign-in';
import { useServerAndBrowser } from '../support/e2e-fixture';
import { controlReadingKeypad, keyIn } from '../support/glove-keypad-keys';
import { bandedPng } from '../support/test-png';

const fixture = useServerAndBrowser();
const phone = { viewport: { width: 412, height: 915 } };
const competitionId = '0193a5c0-0000-7000-8000-000000000001';
const startArea = (path: string) => `${fixture.server.url}/competitions/${competitionId}/start/${path}`;

const signIn = (page: Page, email: string) => signInInBrowser(page, fixture.server.url, email);

const stripText = async (page: Page, item: string) => (await page.locator(`[data-item="${item}"]`).textContent())?.replace(/\s+/g, ' ').trim() ?? '';

interface StoredRow {
  id: string;
  kind: string;
  fields: Record<string, unknown>;
}

async function rowsInPostgres(kind: string): Promise<StoredRow[]> {
  const { rows } = await fixture.server.database.pool.query<StoredRow>(
    'select id, kind, fields from sync_records where competition_id = $1 and kind = $2 order by id',
    [competitionId, kind],
  );
  return rows;
}

async function beginCheck(page: Page, bib: number): Promise<void> {
  await page.goto(startArea('checks'));
  await page.locator('input[name=bib]').fill(String(bib));
  await page.getByRole('button', { name: 'Begin check' }).click();
  await page.getByRole('heading', { name: `Run 1 · Bib ${bib}` }).waitFor();
}

async function goOnline(context: BrowserContext): Promise<number> {
  await context.setOffline(false);
  return Date.now();
}

describe('records made with no signal reach PostgreSQL', () => {
  it('when an official records offline, reloads and comes back online, then the control steel reading, the check and its photo are in PostgreSQL; a push cut off midway drains after the signal returns', async () => {
    const context = await fixture.browser.newContext(phone);
    const page = await context.newPage();
    await signIn(page, 'start-official@frostbarrow.test');
    await page.locator('rl-offline-badge[data-state="ready"]').waitFor({ timeout: 60_000 });
    // One visit with signal brings the competition's rules (the reading interval) onto the device.
    await page.goto(startArea('control-steel'));
    await page.locator('[data-section="countdown"] [data-state]').waitFor();
    // ...and its instruments, so the control steel pyrometer can be chosen with no signal.
    await page.locator('[data-section="control-pyrometer"] button[data-instrument="PYR-01"]').waitFor();

    // On the mountain: no signal from here on.
    await context.setOffline(true);
    await page.reload();
    await page.locator('[data-section="countdown"] [data-state="no-reading-yet"]').waitFor();
    // The demo issues control steel pyrometer PYR-01 to this official.
    await page.locator('[data-section="control-pyrometer"] button[data-instrument="PYR-01"]').click();
    await keyIn(page, '-4.9', controlReadingKeypad(page));
    await controlReadingKeypad(page).getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByRole('status').filter({ hasText: 'Saved on this device' }).waitFor();
    await page.locator('[data-section="countdown"] [data-state="on-time"]').waitFor();

    await beginCheck(page, 7);
    await page.locator('input[name=photo]').setInputFiles({ name: 'burr.png', mimeType: 'image/png', buffer: bandedPng(2400, 1800) });
    await page.getByRole('status').filter({ hasText: 'Photo saved on this device' }).waitFor();
    await page.getByRole('button', { name: '✓ Cleared to start' }).click();
    // The sled's steps are not done here, so clearing it is asked first.
    await page.getByRole('button', { name: 'Yes, cleared to start' }).click();
    await page.getByRole('status').filter({ hasText: 'Cleared to start: saved on this device' }).waitFor();

    await page.reload();
    await page.getByRole('heading', { name: 'Run 1 · Bib 7' }).waitFor();
    await expect.poll(() => page.locator('[data-fact="status"]').textContent()).toContain('Cleared to start');
    await expect.poll(() => page.locator('rl-check-photos img').count()).toBe(1);
    await expect.poll(() => page.locator('rl-check-photos img').evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(1600);
    expect(await stripText(page, 'waiting')).toContain('3 records only on this device');
    expect(await rowsInPostgres('start-check')).toEqual([]);

    // At the hut: the signal returns and the device syncs by itself.
    await goOnline(context);
    await expect.poll(() => stripText(page, 'waiting'), { timeout: 30_000 }).toContain('Nothing waiting to send');
    await expect.poll(() => page.locator('[data-item="photos"]').count(), { timeout: 30_000 }).toBe(0);

    const [reading] = await rowsInPostgres('control-reading');
    expect(reading?.fields).toMatchObject({ reading: { tenths: -49, unit: 'celsius' }, instrumentId: '0193a5c0-0001-7000-8000-000000000101' });
    const [check] = await rowsInPostgres('start-check');
    expect(check?.fields).toMatchObject({ run: 1, bib: 7, status: 'cleared' });
    const photos = await rowsInPostgres('photo');
    expect(photos).toHaveLength(1);
    expect(photos[0]?.fields).toMatchObject({ of: check?.id, purpose: 'evidence', mediaType: 'image/jpeg', width: 1600, height: 1200 });
    const sha256 = String(photos[0]?.fields['sha256']);
    const { rows: uploads } = await fixture.server.database.pool.query('select content_type from uploads where sha256 = $1', [sha256]);
    expect(uploads).toEqual([{ content_type: 'image/jpeg' }]);
    const file = await context.request.get(`${fixture.server.url}/api/uploads/${sha256}`);
    expect(file.status()).toBe(200);
    expect([...(await file.body()).subarray(0, 3)]).toEqual([0xff, 0xd8, 0xff]);

    // The signal drops while a push is on its way: the server commits, the answer never arrives.
    await context.setOffline(true);
    await beginCheck(page, 8);
    await beginCheck(page, 9);
    let cutOff = false;
    await context.route('**/api/sync/push', async (route) => {
      if (cutOff) return route.continue();
      cutOff = true;
      await route.fetch();
      await context.setOffline(true);
      await route.abort('internetdisconnected');
    });
    await context.setOffline(false);
    await expect.poll(() => cutOff, { timeout: 30_000 }).toBe(true);
    await expect.poll(async () => (await rowsInPostgres('start-check')).length, { timeout: 10_000 }).toBe(3);
    expect(await stripText(page, 'waiting')).toMatch(/only on this device/);

    const back = await goOnline(context);
    await expect.poll(() => stripText(page, 'waiting'), { timeout: 30_000 }).toContain('Nothing waiting to send');
    expect(Date.now() - back).toBeLessThan(30_000);
    const checks = await rowsInPostgres('start-check');
    expect(checks.map((c) => c.fields['bib']).sort()).toEqual([7, 8, 9]);
    await context.close();
  });
});
