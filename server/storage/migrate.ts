import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { type Kysely, type Migration, type MigrationProvider, type MigrationResult, Migrator } from 'kysely';
import type { Database } from './database.js';

/** The migrations folder at the top of the repository. */
export const migrationsFolder = fileURLToPath(new URL('../../migrations', import.meta.url));

/**
 * Reads `migrations/*.ts` (or `.js`) in name order. Like kysely's FileMigrationProvider, but the
 * dynamic import lives in our own module, so it loads TypeScript under tsx and vitest alike.
 */
export const folderMigrationProvider: MigrationProvider = {
  async getMigrations() {
    const files = (await readdir(migrationsFolder))
      .filter((f) => /^\d.*\.(ts|js)$/.test(f) && !f.endsWith('.d.ts'))
      .sort();
    const migrations: Record<string, Migration> = {};
    for (const file of files) {
      const module = (await import(pathToFileURL(path.join(migrationsFolder, file)).href)) as Migration;
      migrations[file.replace(/\.(ts|js)$/, '')] = { up: module.up, down: module.down };
    }
    return migrations;
  },
};

function migratorFor(db: Kysely<Database>): Migrator {
  return new Migrator({ db, provider: folderMigrationProvider });
}

/** A migration run that failed; names the migration and the database's own message. */
export class MigrationError extends Error {
  override readonly name = 'MigrationError';
}

/** Applies every pending migration in name order; returns what ran. */
export async function migrateToLatest(db: Kysely<Database>): Promise<readonly MigrationResult[]> {
  const { error, results } = await migratorFor(db).migrateToLatest();
  if (error) {
    const failed = results?.find((result) => result.status === 'Error');
    const message = error instanceof Error ? error.message : String(error);
    throw new MigrationError(`migration ${failed?.migrationName ?? '(none)'} failed: ${message}`);
  }
  return results ?? [];
}

/** Undoes every migration, newest first (tests and `plotgauge migrate --down-to-zero`). */
export async function migrateDownToZero(db: Kysely<Database>): Promise<void> {
  const migrator = migratorFor(db);
  const applied = (await migrator.getMigrations()).filter((m) => m.executedAt !== undefined).length;
  for (let step = 0; step < applied; step++) {
    const { error } = await migrator.migrateDown();
    if (error) throw new MigrationError(`migrating down failed: ${String(error)}`);
  }
}

/** Names of migrations not yet applied; empty when the schema is current. */
export async function pendingMigrations(db: Kysely<Database>): Promise<string[]> {
  const migrations = await migratorFor(db).getMigrations();
  return migrations.filter((migration) => migration.executedAt === undefined).map((m) => m.name);
}
