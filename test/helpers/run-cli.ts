import { vi } from 'vitest';
import { runCli } from '../../server/main.js';

/** What one command-line run printed and returned. */
export interface CliRun {
  code: number;
  out: string[];
  errors: string[];
}

/** Runs the real command line in-process, capturing what it prints to stdout and stderr. */
export async function runCliCaptured(args: string[]): Promise<CliRun> {
  const out: string[] = [];
  const errors: string[] = [];
  const log = vi.spyOn(console, 'log').mockImplementation((line: string) => void out.push(String(line)));
  const error = vi
    .spyOn(console, 'error')
    .mockImplementation((line: string) => void errors.push(String(line)));
  try {
    return { code: await runCli(args), out, errors };
  } finally {
    log.mockRestore();
    error.mockRestore();
  }
}

/**
 * Like runCliCaptured, but also catches what commands write to `process.stdout` directly (CSV,
 * reports); returns all standard output as one text, console lines ending in a newline.
 */
export async function runCliCapturedText(
  args: string[],
): Promise<{ code: number; out: string; errors: string[] }> {
  const chunks: string[] = [];
  const errors: string[] = [];
  const write = vi.spyOn(process.stdout, 'write').mockImplementation((chunk: string | Uint8Array) => {
    chunks.push(String(chunk));
    return true;
  });
  const log = vi.spyOn(console, 'log').mockImplementation((line: string) => void chunks.push(`${line}\n`));
  const error = vi.spyOn(console, 'error').mockImplementation((line: string) => void errors.push(line));
  try {
    return { code: await runCli(args), out: chunks.join(''), errors };
  } finally {
    write.mockRestore();
    log.mockRestore();
    error.mockRestore();
  }
}

/** Collectors for a command run called as a function: its `stdout`/`stderr` writers and what they got. */
export function capturedOutput() {
  const out: string[] = [];
  const err: string[] = [];
  return { out, err, output: { stdout: (t: string) => out.push(t), stderr: (t: string) => err.push(t) } };
}
