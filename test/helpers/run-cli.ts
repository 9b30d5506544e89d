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
