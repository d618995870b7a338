import { spawn } from 'node:child_process';

export interface CommandResult {
  code: number;
  output: string;
}

/** Runs a command to its end, collecting stdout and stderr together for error messages. */
export function runCommand(
  command: string,
  args: readonly string[],
  options: { env?: NodeJS.ProcessEnv; cwd?: string; inherit?: boolean } = {},
): Promise<CommandResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, {
      cwd: options.cwd,
      env: options.env ?? process.env,
      stdio: options.inherit ? 'inherit' : ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code: code ?? 1, output }));
  });
}

/** Like runCommand, but a non-zero exit is an error that quotes the command's output. */
export async function runOrThrow(
  command: string,
  args: readonly string[],
  options: Parameters<typeof runCommand>[2] = {},
): Promise<string> {
  const result = await runCommand(command, args, options);
  if (result.code !== 0) {
    throw new Error(`${command} ${args.join(' ')} exited with ${result.code}:\n${result.output.trim()}`);
  }
  return result.output;
}
