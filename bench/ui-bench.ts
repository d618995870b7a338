/**
 * `npm run bench:ui`: two field qualities of the start area, each beside its floor in the same run.
 * A measurement, not a test: it prints the numbers and exits 0 unless something could not be measured.
 *
 * 1. Keypad OK to committed: in Debian's Chromium with an on-disk profile, an official signed in on the
 *    control steel screen with no signal keys 200 readings; for each, the time from the click on the
 *    keypad's OK to the `complete` event of the app's IndexedDB write transaction (and to the "Saved on
 *    this device" status). Floor: 200 plain IndexedDB puts of a row of the same size in a fresh database
 *    of the same page, one transaction each, durability 'strict' like the app's.
 * 2. Initial JavaScript: the files the production build's index.html loads and everything they import
 *    statically, raw and as Angular estimates the transfer (brotli for files from 1 kB), beside a blank
 *    Angular Material app (`bench/blank-app`, project `bench-blank`) built with the same settings.
 *
 * Needs the production build in dist/rimelog/browser (`npm run build`); starts its own PostgreSQL.
 */
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { chmod, mkdtemp, readFile, rm } from 'node:fs/promises';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { brotliCompressSync } from 'node:zlib';
import { chromium, type Page } from 'playwright-core';
import { createApp } from '../server/app';
import { projectRoot } from '../server/config';
import { connectDatabase } from '../server/db/client';
import { applyMigrations } from '../server/db/migrate';
import { createLogger } from '../server/logger';
import { demoOpenCompetitionId, seedDemoScenario } from '../server/ops/demo-scenario';
import { demoPassword } from '../server/ops/demo-users';
import { freePort, startLocalPostgres } from '../server/ops/postgres';
import { chromiumPath } from '../tests/support/browser';
import { discardingMailer } from '../tests/support/fake-mail';
import { controlReadingKeypad, keyIn } from '../tests/support/glove-keypad-keys';

const readings = 200;
const warmUpReadings = 5;
const clientDir = process.env['CLIENT_DIR'] ?? path.join(projectRoot, 'dist/rimelog/browser');
const pageScript = path.join(projectRoot, 'bench/ui-bench-page.js');

const percentile = (values: number[], p: number) => [...values].sort((a, b) => a - b)[Math.max(0, Math.ceil((p / 100) * values.length) - 1)]!;
const number = (n: number, digits = 0) => n.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });
const kB = (bytes: number) => `${number(bytes / 1000, 1)} kB`;

function printTable(rows: string[][]): void {
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((row) => row[c]!.length)));
  for (const row of rows) console.log(row.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join('   '));
}

// ---- initial JavaScript --------------------------------------------------------------------------

interface InitialScripts {
  files: number;
  rawBytes: number;
  /** Brotli size of each file from 1,024 bytes, raw size of smaller ones: Angular's "estimated transfer size". */
  transferBytes: number;
}

/** The scripts index.html loads and, recursively, every file they import statically (not `import()`). */
async function initialScripts(browserDir: string): Promise<InitialScripts> {
  const html = await readFile(path.join(browserDir, 'index.html'), 'utf8');
  const queue = [...html.matchAll(/<script\b[^>]*\bsrc="([^"]+\.js)"/g)].map((m) => m[1]!);
  if (queue.length === 0) throw new Error(`No script in ${browserDir}/index.html.`);
  const seen = new Set<string>();
  let rawBytes = 0;
  let transferBytes = 0;
  while (queue.length > 0) {
    const file = queue.shift()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const contents = await readFile(path.join(browserDir, file));
    rawBytes += contents.length;
    transferBytes += contents.length < 1024 ? contents.length : brotliCompressSync(contents).length;
    // esbuild writes static imports as `import{a as b}from"./chunk-X.js"` or `import"./chunk-X.js"`.
    for (const m of contents.toString('utf8').matchAll(/\b(?:import|export)\s*(?:[\w$*{}\s,]*?from\s*)?["']\.\/([^"']+\.js)["']/g)) queue.push(m[1]!);
  }
  return { files: seen.size, rawBytes, transferBytes };
}

async function buildBlankApp(outputDir: string): Promise<string> {
  const ng = path.join(projectRoot, 'node_modules/@angular/cli/bin/ng.js');
  try {
    await promisify(execFile)(process.execPath, [ng, 'build', 'bench-blank', '--configuration', 'production', '--output-path', outputDir], {
      cwd: projectRoot,
      env: { ...process.env, NG_CLI_ANALYTICS: 'false', FORCE_COLOR: '0' },
      maxBuffer: 16 * 1024 * 1024,
    });
  } catch (error) {
    const { stdout = '', stderr = '' } = error as { stdout?: string; stderr?: string };
    throw new Error(`The blank app did not build:\n${stdout}\n${stderr}`);
  }
  return path.join(outputDir, 'browser');
}

// ---- keypad OK to committed ----------------------------------------------------------------------

interface PageMarks {
  okClicks: number[];
  commits: number[];
  commitStarts: number[];
  savedShown: number[];
}

/** What bench/ui-bench-page.js puts on the page as `rimelogBench`. */
interface PageBench extends PageMarks {
  storedSample(): Promise<{ readings: number; record: unknown; outbox: unknown }>;
  floor(count: number, row: unknown): Promise<number[]>;
}
type BenchWindow = { rimelogBench: PageBench };

// Functions, not strings: the app's Content-Security-Policy forbids evaluating strings in the page.
const readMarks = (page: Page) =>
  page.evaluate((): PageMarks => {
    const { okClicks, commits, commitStarts, savedShown } = (globalThis as unknown as BenchWindow).rimelogBench;
    return { okClicks, commits, commitStarts, savedShown };
  });

/** Between -0.1 and -15.0 °C, so every reading is in range. */
function readingText(n: number): string {
  const tenths = 1 + (n % 150);
  return `-${Math.floor(tenths / 10)}.${tenths % 10}`;
}

/** The index of the first time in `times` after `after`. */
function firstAfter(times: number[], after: number): number {
  const found = times.findIndex((t) => t >= after);
  if (found === -1) throw new Error('A reading was not committed or shown after its OK.');
  return found;
}

interface KeypadTimings {
  toCommit: number[];
  /** From the app opening its write transaction to that transaction's complete event. */
  inTransaction: number[];
  toShown: number[];
  floor: number[];
  rowBytes: number;
  storedReadings: number;
}

async function measureKeypad(baseUrl: string, profileDir: string): Promise<KeypadTimings> {
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: chromiumPath,
    headless: true,
    viewport: { width: 412, height: 915 },
    serviceWorkers: 'block',
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  try {
    await context.addInitScript({ path: pageScript });
    const page = context.pages()[0] ?? (await context.newPage());
    await page.goto(`${baseUrl}/sign-in`);
    await page.locator('input[name=email]').fill('start-official@frostbarrow.test');
    await page.locator('input[name=password]').fill(demoPassword);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL((url) => url.pathname === '/');
    // With signal once, so the competition's rules reach the device; then none, as at the start house.
    await page.goto(`${baseUrl}/competitions/${demoOpenCompetitionId}/start/control-steel`);
    await page.locator('[data-section="countdown"] [data-state]').waitFor();
    await page.locator('[data-section="control-pyrometer"] button[data-instrument="PYR-01"]').click();
    await context.setOffline(true);

    for (let n = 0; n < warmUpReadings + readings; n += 1) {
      await controlReadingKeypad(page).waitFor();
      await keyIn(page, readingText(n), controlReadingKeypad(page));
      await controlReadingKeypad(page).getByRole('button', { name: 'Save', exact: true }).click();
      await page.waitForFunction((count) => {
        const marks = (globalThis as unknown as BenchWindow).rimelogBench;
        return marks.commits.length >= count && marks.savedShown.length >= count;
      }, n + 1);
    }
    const marks = await readMarks(page);
    if (marks.okClicks.length !== warmUpReadings + readings || marks.commits.length !== marks.okClicks.length) {
      throw new Error(`Expected ${warmUpReadings + readings} OKs, each with one commit; saw ${marks.okClicks.length} OKs and ${marks.commits.length} commits.`);
    }
    const timed = marks.okClicks.slice(warmUpReadings);
    const commitOf = timed.map((t0) => firstAfter(marks.commits, t0));
    const toCommit = timed.map((t0, i) => marks.commits[commitOf[i]!]! - t0);
    const inTransaction = commitOf.map((j) => marks.commits[j]! - marks.commitStarts[j]!);
    const toShown = timed.map((t0) => marks.savedShown[firstAfter(marks.savedShown, t0)]! - t0);

    const sample = await page.evaluate(() => (globalThis as unknown as BenchWindow).rimelogBench.storedSample());
    if (!sample.record || !sample.outbox) throw new Error('The newest reading or its outbox entry is not in IndexedDB.');
    const row = { record: sample.record, outbox: sample.outbox };
    const floorWrites = ([count, written]: [number, unknown]) => (globalThis as unknown as BenchWindow).rimelogBench.floor(count, written);
    await page.evaluate(floorWrites, [warmUpReadings, row] as [number, unknown]);
    const floor = await page.evaluate(floorWrites, [readings, row] as [number, unknown]);
    return { toCommit, inTransaction, toShown, floor, rowBytes: JSON.stringify(row).length, storedReadings: sample.readings };
  } finally {
    await context.close();
  }
}

// ---- the run -------------------------------------------------------------------------------------

async function main(): Promise<void> {
  if (!existsSync(path.join(clientDir, 'ngsw.json'))) {
    console.error(`No production build in ${clientDir}: run \`npm run build\` first.`);
    process.exitCode = 1;
    return;
  }
  const folder = await mkdtemp(path.join(os.tmpdir(), 'rimelog-bench-ui-'));
  await chmod(folder, 0o711);

  try {
    console.log('Building the blank Angular Material app (project bench-blank, production settings)…');
    const blank = await initialScripts(await buildBlankApp(path.join(folder, 'blank-build')));
    const app = await initialScripts(clientDir);

    const postgres = await startLocalPostgres({ dataDir: path.join(folder, 'pg'), port: await freePort(), throwaway: true });
    const database = connectDatabase(postgres.url);
    // Stopping the server ends idle connections; that is expected here, not an error.
    database.pool.on('error', () => {});
    let server: Server | undefined;
    let keypad: KeypadTimings;
    try {
      await applyMigrations(database.db);
      await seedDemoScenario(database.db);
      const express = createApp({
        db: database.db,
        logger: createLogger('silent'),
        clientDir,
        mailer: discardingMailer(),
        publicUrl: 'http://rimelog.test',
        uploadsDir: path.join(folder, 'uploads'),
      });
      server = await new Promise<Server>((resolve) => {
        const listening = express.listen(0, '127.0.0.1', () => resolve(listening));
      });
      const { port } = server.address() as AddressInfo;
      console.log(`Keying ${warmUpReadings} + ${readings} control steel readings in Chromium…`);
      keypad = await measureKeypad(`http://127.0.0.1:${port}`, path.join(folder, 'chromium-profile'));
    } finally {
      server?.closeAllConnections();
      await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
      await database.close();
      await postgres.stop();
    }

    const ms = (values: number[], p: number) => `${number(percentile(values, p), 1)} ms`;
    const ratio = (values: number[], p: number) => number(percentile(values, p) / percentile(keypad.floor, p), 1);
    console.log(`\nKeypad OK to committed: ${readings} control steel readings after ${warmUpReadings} not timed, Chromium ${chromiumPath}, on-disk profile, offline.`);
    console.log('Method: on the page clock, t0 = the OK click (capture listener, before the app sees it); t1 = the `complete`');
    console.log("event of the app's IndexedDB transaction (records + outbox + meta), i.e. committed with durability 'strict';");
    console.log('"shown" = the moment the "Saved on this device" status gets its text.');
    console.log(`Floor: one put per transaction of a ${number(keypad.rowBytes)}-byte row (the stored reading and its outbox entry),`);
    console.log(`durability 'strict', in a fresh IndexedDB database of the same page. Readings in IndexedDB afterwards: ${keypad.storedReadings}.\n`);
    printTable([
      ['', 'p50', 'p95', 'p50 / floor', 'p95 / floor'],
      ['OK → committed in IndexedDB', ms(keypad.toCommit, 50), ms(keypad.toCommit, 95), ratio(keypad.toCommit, 50), ratio(keypad.toCommit, 95)],
      ['  of which transaction open → committed', ms(keypad.inTransaction, 50), ms(keypad.inTransaction, 95), ratio(keypad.inTransaction, 50), ratio(keypad.inTransaction, 95)],
      ['OK → "Saved on this device" shown', ms(keypad.toShown, 50), ms(keypad.toShown, 95), ratio(keypad.toShown, 50), ratio(keypad.toShown, 95)],
      ['floor: empty IndexedDB put, strict', ms(keypad.floor, 50), ms(keypad.floor, 95), '1.0', '1.0'],
    ]);
    const quarter = Math.floor(readings / 4);
    console.log(
      `\nOK → committed, p50 of the first ${quarter} readings: ${ms(keypad.toCommit.slice(0, quarter), 50)}; of the last ${quarter}: ` +
        `${ms(keypad.toCommit.slice(-quarter), 50)} (the log on the screen grows to ${keypad.storedReadings} entries).`,
    );

    console.log('\nInitial JavaScript: the scripts index.html loads and all they import statically; transfer = brotli, as Angular estimates it.\n');
    printTable([
      ['', 'files', 'raw', 'transfer'],
      ['Rimelog (dist/rimelog/browser)', String(app.files), kB(app.rawBytes), kB(app.transferBytes)],
      ['blank Angular Material app (bench-blank)', String(blank.files), kB(blank.rawBytes), kB(blank.transferBytes)],
      ['ratio Rimelog / blank', '', number(app.rawBytes / blank.rawBytes, 2), number(app.transferBytes / blank.transferBytes, 2)],
    ]);
  } finally {
    await rm(folder, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
