import { randomUUID } from 'node:crypto';
import type { Command } from 'commander';
import { insertAuditEntry } from '../storage/audit-repository.js';
import { nowIso } from '../storage/db-handle.js';
import {
  createAccessToken,
  listAccessTokens,
  revokeAccessToken,
  type TokenRole,
  tokenRoles,
} from '../storage/token-repository.js';
import { CliError } from './cli-error.js';
import { commandConfig, withDatabase, withDatabaseFlag } from './command-config.js';

interface CreateFlags {
  database?: string;
  role: string;
  label?: string;
}

/**
 * `plotgauge token create --role admin|analyst [--label …]` prints a new team token once (only its
 * SHA-256 is stored); `token list` shows labels, roles and last use (never hashes); `token revoke
 * <id>` ends a token and every console sign-in made with it. Each change is audited as 'cli'.
 */
export function registerTokenCommand(program: Command): void {
  const token = program.command('token').description('team tokens: admin (changes) or analyst (reads)');

  withDatabaseFlag(token.command('create').description('make a token; it is printed once and never again'))
    .requiredOption('--role <role>', `one of ${tokenRoles.join(', ')}`)
    .option('--label <text>', 'who holds it, e.g. "analysis laptop" (the audit log names it)')
    .action(async (flags: CreateFlags) => {
      if (!(tokenRoles as readonly string[]).includes(flags.role))
        throw new CliError(
          `--role: must be one of ${tokenRoles.join(', ')} (got ${JSON.stringify(flags.role)})`,
        );
      const label = (flags.label ?? `${flags.role} token`).trim();
      if (label.length === 0 || label.length > 100)
        throw new CliError('--label: must be 1 to 100 characters');
      const created = await withDatabase(commandConfig(flags), (db) =>
        db.transaction().execute(async (trx) => {
          const made = await createAccessToken(trx, flags.role as TokenRole, label);
          await insertAuditEntry(trx, {
            id: randomUUID(),
            at: nowIso(),
            actor: 'cli',
            action: 'token.create',
            subject: made.summary.id,
            details: { label, role: made.summary.role },
          });
          return made;
        }),
      );
      console.log(`token ${created.summary.id} (${created.summary.role}, "${created.summary.label}"):`);
      console.log(created.token);
      console.log('It is shown only now; store it in a password manager.');
    });

  withDatabaseFlag(token.command('list').description('labels, roles and last use of every token')).action(
    async (flags: { database?: string }) => {
      const tokens = await withDatabase(commandConfig(flags), (db) => listAccessTokens(db));
      if (tokens.length === 0) {
        console.log('no tokens (plotgauge token create --role admin|analyst)');
        return;
      }
      for (const t of tokens) {
        const state = t.revokedAt === null ? 'active' : `revoked ${t.revokedAt}`;
        console.log(
          `${t.id}  ${t.role.padEnd(7)}  ${state.padEnd(8)}  last used ${t.lastUsedAt ?? 'never'}  "${t.label}"`,
        );
      }
    },
  );

  withDatabaseFlag(token.command('revoke').description('end a token at once (and its console sign-ins)'))
    .argument('<id>', 'token id (see plotgauge token list)')
    .action(async (id: string, flags: { database?: string }) => {
      const revoked = await withDatabase(commandConfig(flags), (db) =>
        db.transaction().execute(async (trx) => {
          const done = await revokeAccessToken(trx, id);
          if (done) {
            await insertAuditEntry(trx, {
              id: randomUUID(),
              at: nowIso(),
              actor: 'cli',
              action: 'token.revoke',
              subject: id,
              details: {},
            });
          }
          return done;
        }),
      );
      if (!revoked)
        throw new CliError(`no active token with id ${JSON.stringify(id)} (see plotgauge token list)`);
      console.log(`token ${id} revoked`);
    });
}
