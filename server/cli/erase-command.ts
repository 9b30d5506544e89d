import type { Command } from 'commander';
import { attemptIdOfToken, eraseAttempt } from '../storage/erasure-repository.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';

interface EraseFlags {
  database?: string;
  attempt?: string;
  token?: string;
}

/**
 * `plotgauge erase --attempt <id>` (or `--token <the respondent's attempt token>`): removes one
 * person's attempt and answers on request; the audit log keeps that it happened, not what was erased.
 */
export function registerEraseCommand(program: Command): void {
  withDatabaseFlag(program.command('erase').description("remove one person's attempt and answers"))
    .option('--attempt <id>', 'attempt id (e.g. from an export)')
    .option('--token <token>', "the respondent's own attempt token (from their device)")
    .action(async (flags: EraseFlags) => {
      if ((flags.attempt === undefined) === (flags.token === undefined))
        throw new CliError('give exactly one of --attempt <id> or --token <token>');
      const erased = await withDatabase(commandConfig(flags), (db) =>
        db.transaction().execute(async (trx) => {
          const id = flags.attempt ?? (await attemptIdOfToken(trx, flags.token as string));
          return id === undefined ? undefined : eraseAttempt(trx, id, 'cli');
        }),
      );
      if (erased === undefined) throw new CliError('no such attempt (already erased?)');
      console.log(
        `attempt ${erased.attemptId} erased with ${erased.responses} responses; noted in the audit log`,
      );
    });
}
