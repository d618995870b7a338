/**
 * The one test command: every suite in order, then one summary line `N passed, N failed`.
 * Usage: tsx tests/run-all.ts [--only <stage>[,<stage>]]   stages: typecheck, unit, ng, build, e2e
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { projectRoot } from '../server/config';
import { runCommand } from '../server/ops/run-command';
import { chromiumPath } from './support/browser';

interface StageResult {
  name: string;
  passed: number;
  failed: number;
  note?: string;
}

interface Stage {
  name: string;
  run(reportFile: string): Promise<StageResult>;
}

const bin = (name: string) => path.join(projectRoot, 'node_modules', '.bin', name);
const env = { ...process.env, NG_CLI_ANALYTICS: 'false', CI: process.env['CI'] ?? '1' };

/** Vitest's JSON report counts tests; a run that fails outside any test still counts as one failure. */
function countFromVitestReport(name: string, code: number, reportFile: string): StageResult {
  if (!existsSync(reportFile)) {
    return { name, passed: 0, failed: 1, note: `no report written (exit ${code})` };
  }
  const report = JSON.parse(readFileSync(reportFile, 'utf8')) as {
    numPassedTests: number;
    numFailedTests: number;
    numTotalTests: number;
  };
  const failedOutsideTests = code !== 0 && report.numFailedTests === 0 ? 1 : 0;
  return {
    name,
    passed: report.numPassedTests,
    failed: report.numFailedTests + failedOutsideTests,
    note: failedOutsideTests ? `exit ${code} with no failing test: see the output above` : undefined,
  };
}

async function runReported(name: string, command: string, args: string[], reportFile: string): Promise<StageResult> {
  const { code } = await runCommand(bin(command), args, { cwd: projectRoot, env, inherit: true });
  return countFromVitestReport(name, code, reportFile);
}

const vitestReporters = (reportFile: string) => ['--reporter=default', '--reporter=json', `--outputFile=${reportFile}`];

/** A step that either works or does not, counted as one check. */
async function runStep(name: string, command: string, args: string[]): Promise<StageResult> {
  const { code } = await runCommand(command, args, { cwd: projectRoot, env, inherit: true });
  return { name, passed: code === 0 ? 1 : 0, failed: code === 0 ? 0 : 1 };
}

async function ensureChromium(): Promise<void> {
  if (existsSync(chromiumPath)) return;
  if (process.getuid?.() !== 0) {
    throw new Error(`Chromium not found at ${chromiumPath}; install Debian's chromium package (apt-get install chromium).`);
  }
  console.log('Installing Debian chromium for the end-to-end tests ...');
  const aptEnv = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  await runCommand('apt-get', ['update'], { env: aptEnv, inherit: true });
  const { code } = await runCommand('apt-get', ['install', '-y', '--no-install-recommends', 'chromium'], { env: aptEnv, inherit: true });
  if (code !== 0 || !existsSync(chromiumPath)) throw new Error('apt-get could not install chromium');
}

const stages: Stage[] = [
  {
    name: 'typecheck',
    run: async () => {
      const server = await runStep('typecheck server', bin('tsc'), ['-p', 'tsconfig.server.json']);
      const e2e = await runStep('typecheck e2e', bin('tsc'), ['-p', 'tsconfig.e2e.json']);
      return { name: 'typecheck server, shared and tests', passed: server.passed + e2e.passed, failed: server.failed + e2e.failed };
    },
  },
  { name: 'unit', run: (report) => runReported('unit + server integration', 'vitest', ['run', '--config', 'tests/vitest.config.ts', ...vitestReporters(report)], report) },
  {
    name: 'ng',
    run: (report) =>
      runReported('angular component specs', 'ng', ['test', '--no-watch', '--reporters=default', '--reporters=json', `--output-file=${report}`], report),
  },
  { name: 'build', run: () => runStep('production build', bin('ng'), ['build', '--configuration', 'production']) },
  {
    name: 'e2e',
    run: async (report) => {
      try {
        await ensureChromium();
      } catch (error) {
        console.error(error);
        return { name: 'end-to-end', passed: 0, failed: 1, note: 'no browser' };
      }
      return runReported('end-to-end in chromium', 'vitest', ['run', '--config', 'tests/e2e/vitest.config.ts', ...vitestReporters(report)], report);
    },
  },
];

async function main(): Promise<number> {
  const onlyIndex = process.argv.indexOf('--only');
  const only = onlyIndex >= 0 ? (process.argv[onlyIndex + 1] ?? '').split(',') : undefined;
  const unknown = only?.filter((name) => !stages.some((stage) => stage.name === name)) ?? [];
  if (unknown.length > 0) {
    console.error(`Unknown stage(s): ${unknown.join(', ')}. Stages: ${stages.map((s) => s.name).join(', ')}`);
    return 2;
  }
  // The e2e stage needs a current production build.
  const selected = stages.filter((stage) => !only || only.includes(stage.name) || (stage.name === 'build' && only.includes('e2e')));

  const reportDir = mkdtempSync(path.join(tmpdir(), 'rimelog-test-reports-'));
  const results: StageResult[] = [];
  try {
    for (const stage of selected) {
      console.log(`\n=== ${stage.name} ===`);
      // ng test resolves its output file against the workspace, so pass absolute paths.
      results.push(await stage.run(path.join(reportDir, `${stage.name}.json`)));
    }
  } finally {
    rmSync(reportDir, { recursive: true, force: true });
  }

  console.log('\n=== summary ===');
  for (const result of results) {
    console.log(`${result.name}: ${result.passed} passed, ${result.failed} failed${result.note ? ` (${result.note})` : ''}`);
  }
  const passed = results.reduce((sum, r) => sum + r.passed, 0);
  const failed = results.reduce((sum, r) => sum + r.failed, 0);
  console.log(`${passed} passed, ${failed} failed`);
  return failed > 0 || passed === 0 ? 1 : 0;
}

process.exitCode = await main();
