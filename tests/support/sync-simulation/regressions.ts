import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { projectRoot } from '../../../server/config';
import type { SimulationOptions } from './run-simulation';

/** Seeds the soak found failing; the simulation test runs each of them as a fixed seed. */
export const regressionsFile = path.join(projectRoot, 'tests/server/sync-simulation.regressions.json');

export interface Regression extends SimulationOptions {
  /** The first problem the seed showed, to say what it is about. */
  found: string;
  foundOn: string;
}

export function readRegressions(): Regression[] {
  if (!existsSync(regressionsFile)) return [];
  return JSON.parse(readFileSync(regressionsFile, 'utf8')) as Regression[];
}

/** Pins a failing seed (once) as a regression test. */
export function pinRegression(options: SimulationOptions, problem: string): void {
  const pinned = readRegressions();
  if (pinned.some((r) => r.seed === options.seed && r.opsPerDevice === options.opsPerDevice && r.devices === options.devices)) return;
  pinned.push({ ...options, found: problem.slice(0, 300), foundOn: new Date().toISOString().slice(0, 10) });
  writeFileSync(regressionsFile, `${JSON.stringify(pinned, null, 2)}\n`);
}
