import type { Kysely } from 'kysely';

/**
 * Sympson–Hetter exposure control values tuned by simulation for one study, kept with the
 * calibration they were tuned against: they hold only for that calibration's difficulties and for
 * the adaptive settings named in `settings` (whose SHA-256 is `settings_hash`, the lookup key).
 * `item_parameters` is JSON `{ itemId: K }`, K in [0, 1] the chance that a selected item is given.
 * A row is never updated: tuning again adds a row, and the newest row for a calibration and
 * settings is the one new attempts start with. Deleting the study or the calibration removes them.
 * Frozen once merged: later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('exposure_controls')
    .addColumn('id', 'text', (c) => c.primaryKey().notNull())
    .addColumn('study_id', 'text', (c) => c.notNull().references('studies.id').onDelete('cascade'))
    .addColumn('calibration_id', 'text', (c) => c.notNull().references('calibrations.id').onDelete('cascade'))
    .addColumn('settings', 'text', (c) => c.notNull())
    .addColumn('settings_hash', 'text', (c) => c.notNull())
    .addColumn('item_parameters', 'text', (c) => c.notNull())
    .addColumn('target_max_exposure', 'double precision', (c) => c.notNull())
    .addColumn('achieved_max_exposure', 'double precision', (c) => c.notNull())
    .addColumn('simulation', 'text', (c) => c.notNull())
    .addColumn('created_at', 'text', (c) => c.notNull())
    .addColumn('created_by', 'text', (c) => c.notNull())
    .execute();
  await db.schema
    .createIndex('exposure_controls_calibration_idx')
    .on('exposure_controls')
    .columns(['calibration_id', 'settings_hash'])
    .execute();
  await db.schema
    .createIndex('exposure_controls_study_idx')
    .on('exposure_controls')
    .column('study_id')
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('exposure_controls').execute();
}
