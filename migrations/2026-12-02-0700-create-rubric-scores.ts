import { type Kysely, sql } from 'kysely';

/**
 * Rubric scores: one row per rater per short-text answer, scored 0, 1 or 2 against the item's rubric.
 * A response's erasure removes its scores (ON DELETE CASCADE); a rater scores an answer at most once
 * (unique response_id + rater). The rater is a team token's label, never a respondent.
 * Frozen once merged: later changes are new migrations.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('rubric_scores')
    .addColumn('id', 'text', (c) => c.primaryKey().notNull())
    .addColumn('response_id', 'text', (c) => c.notNull().references('responses.id').onDelete('cascade'))
    .addColumn('rater', 'text', (c) => c.notNull())
    .addColumn('score', 'integer', (c) => c.notNull().check(sql`score >= 0 and score <= 2`))
    .addColumn('scored_at', 'text', (c) => c.notNull())
    .addUniqueConstraint('rubric_scores_response_rater_unique', ['response_id', 'rater'])
    .execute();
  await db.schema
    .createIndex('rubric_scores_response_idx')
    .on('rubric_scores')
    .column('response_id')
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await db.schema.dropTable('rubric_scores').execute();
}
