import { type ChildProcess, spawn } from 'node:child_process';
import { createServer } from 'node:net';
import { fileURLToPath } from 'node:url';

/** The repository root (where `scripts/plotgauge.js` and `items/` are). */
export const repo = fileURLToPath(new URL('../..', import.meta.url));

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** A loopback port nobody listens on right now. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address !== null ? address.port : 0));
    });
  });
}

/** Runs the real command line (`scripts/plotgauge.js`) as a child process. */
export function spawnCli(args: string[], env: Record<string, string> = {}): ChildProcess {
  return spawn(process.execPath, ['scripts/plotgauge.js', ...args], {
    cwd: repo,
    env: { ...process.env, ITEMS_DIR: 'items', LOG_LEVEL: 'warn', SQLITE_SYNC: 'full', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
}

/** Runs a command to its end; resolves with its exit code and what it printed. */
export async function runCliProcess(
  args: string[],
  env: Record<string, string> = {},
): Promise<{ code: number | null; out: string; errors: string }> {
  const child = spawnCli(args, env);
  let out = '';
  let errors = '';
  child.stdout?.on('data', (chunk: Buffer) => {
    out += chunk.toString('utf8');
  });
  child.stderr?.on('data', (chunk: Buffer) => {
    errors += chunk.toString('utf8');
  });
  const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
  return { code, out, errors };
}

/** `plotgauge serve` on loopback; resolves once `/ready` answers (or kills it after 30 s). */
export async function startServer(
  port: number,
  databaseUrl: string,
  env: Record<string, string> = {},
): Promise<ChildProcess> {
  const child = spawnCli(
    ['serve', '--port', String(port), '--host', '127.0.0.1', '--database', databaseUrl],
    env,
  );
  child.stdout?.resume();
  child.stderr?.resume();
  const until = Date.now() + 30_000;
  while (Date.now() < until) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/ready`)).ok) return child;
    } catch {
      // not listening yet
    }
    await sleep(100);
  }
  child.kill('SIGKILL');
  throw new Error('server did not become ready');
}

/** SIGTERM and wait for the exit. */
export async function stopServer(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGTERM');
  await exited;
}
