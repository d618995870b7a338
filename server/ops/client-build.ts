import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { runOrThrow } from './run-command';

const clientInputs = ['src', 'shared', 'angular.json', 'ngsw-config.json', 'package-lock.json', 'tsconfig.json', 'tsconfig.app.json'];

function newestChange(target: string): number {
  if (!existsSync(target)) return 0;
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(target)) {
    newest = Math.max(newest, newestChange(path.join(target, entry)));
  }
  return newest;
}

/** True when the built app is missing or older than any file it is built from. */
export function isClientBuildStale(projectRoot: string, clientDir: string): boolean {
  const built = path.join(clientDir, 'ngsw.json');
  if (!existsSync(built)) return true;
  const builtAt = statSync(built).mtimeMs;
  return clientInputs.some((input) => newestChange(path.join(projectRoot, input)) > builtAt);
}

/** Runs the production build of the Angular app (with its service worker). */
export async function buildClient(projectRoot: string): Promise<void> {
  const ng = path.join(projectRoot, 'node_modules', '.bin', 'ng');
  await runOrThrow(ng, ['build', '--configuration', 'production'], {
    cwd: projectRoot,
    inherit: true,
    env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
  });
}
