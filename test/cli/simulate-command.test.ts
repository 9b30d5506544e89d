import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { Command } from 'commander';
import { describe, expect, it } from 'vitest';
import { CliError } from '../../server/cli/cli-error.js';
import {
  inventedBankItems,
  registerSimulateCommand,
  runSimulateAdaptive,
} from '../../server/cli/simulate-command.js';

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  return { out, err, output: { stdout: (t: string) => out.push(t), stderr: (t: string) => err.push(t) } };
}

describe('simulate adaptive', () => {
  it('prints a row per audience and design and writes the SVG', { timeout: 60000 }, async () => {
    const folder = await mkdtemp(path.join(tmpdir(), 'simulate-'));
    const svg = path.join(folder, 'out.svg');
    const { out, err, output } = capture();
    const result = await runSimulateAdaptive(
      { bankSize: 90, persons: 40, maxItems: 20, noExposureControl: true, seed: 3, svg },
      output,
    );
    const text = out.join('');
    expect(text).toContain('90 INVENTED items');
    for (const mean of ['-1', '0', '1']) {
      expect(text).toMatch(new RegExp(`mean ${mean} +adaptive +\\d+\\.\\d`));
      expect(text).toContain(`mean ${mean}: adaptive uses`);
    }
    expect(text).toContain(`largest adaptive exposure ${result.maxExposure.toFixed(3)}`);
    expect(text).not.toContain('Sympson-Hetter exposure control tuned');
    expect(err.join('')).toContain(`wrote ${svg}`);
    expect(await readFile(svg, 'utf8')).toMatch(/^<svg[^>]*role="img"/);
  });

  it('tunes Sympson-Hetter when the largest exposure is above the limit', { timeout: 120000 }, async () => {
    const { out, output } = capture();
    await runSimulateAdaptive({ bankSize: 45, persons: 30, maxItems: 15, randomesque: 1, seed: 2 }, output);
    expect(out.join('')).toMatch(/Sympson-Hetter exposure control tuned for 0.3 \(\d+ rounds/);
  });

  it('reads calibrated difficulties and refuses bad options with one line', async () => {
    const folder = await mkdtemp(path.join(tmpdir(), 'simulate-'));
    const bad = path.join(folder, 'bad.csv');
    await writeFile(bad, 'item,value\na,1\n');
    const { output } = capture();
    await expect(runSimulateAdaptive({ bankSize: 20, persons: 0 }, output)).rejects.toThrow(
      '--persons must be an integer',
    );
    await expect(runSimulateAdaptive({ bankSize: 20, seTarget: 0 }, output)).rejects.toThrow('--se-target');
    await expect(runSimulateAdaptive({ bankSize: 20, balance: 'colour' as 'level' }, output)).rejects.toThrow(
      '--balance',
    );
    await expect(
      runSimulateAdaptive(
        { difficulties: bad },
        { ...output, loadBank: async () => ({ items: [] }) as never },
      ),
    ).rejects.toThrow('columns item,difficulty');
    await expect(
      runSimulateAdaptive(
        { difficulties: path.join(folder, 'missing.csv') },
        { ...output, loadBank: async () => ({ items: [] }) as never },
      ),
    ).rejects.toBeInstanceOf(CliError);
  });

  it('deals invented difficulties in an order unrelated to the ids', () => {
    const items = inventedBankItems(30, 'level');
    const difficulties = items.map((i) => i.difficulty);
    expect([...difficulties].sort((a, b) => a - b)[0]).toBe(-3);
    expect(difficulties).not.toEqual([...difficulties].sort((a, b) => a - b));
    expect(new Set(items.map((i) => i.area))).toEqual(new Set(['read', 'interpret', 'envision']));
  });

  it('registers `simulate adaptive` and rejects --bank-size with --from-bank', async () => {
    const program = new Command('plotgauge').exitOverride();
    registerSimulateCommand(program);
    await expect(
      program.parseAsync(['simulate', 'adaptive', '--bank-size', '20', '--from-bank'], { from: 'user' }),
    ).rejects.toThrow('exclude each other');
  });
});
