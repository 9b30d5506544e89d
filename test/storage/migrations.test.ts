import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '../../server/storage/database.js';
import { migrateDownToZero, migrateToLatest, pendingMigrations } from '../../server/storage/migrate.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** Engine-neutral names for the column types the migrations use. */
const typeNames: Record<string, string> = {
  text: 'text',
  integer: 'integer',
  int4: 'integer',
  'double precision': 'double precision',
  float8: 'double precision',
};

type SchemaShape = Record<string, Record<string, { type: string; nullable: boolean }>>;

async function schemaShape(db: Kysely<Database>): Promise<SchemaShape> {
  const tables = await db.introspection.getTables();
  const shape: SchemaShape = {};
  for (const table of tables.filter((t) => !t.name.startsWith('kysely_'))) {
    const columns: SchemaShape[string] = {};
    for (const column of table.columns) {
      columns[column.name] = {
        type: typeNames[column.dataType.toLowerCase()] ?? `unknown:${column.dataType}`,
        nullable: column.isNullable,
      };
    }
    shape[table.name] = columns;
  }
  return shape;
}

const shapes: Partial<Record<string, SchemaShape>> = {};

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(`${engine.engine}: migrations`, () => {
    let database: TestDatabase;
    beforeAll(async () => {
      database = await engine.open();
    });
    afterAll(async () => {
      await database?.cleanup();
    });

    it('migrates up to latest, leaving nothing pending', async () => {
      expect((await pendingMigrations(database.db)).length).toBeGreaterThan(0);
      await migrateToLatest(database.db);
      expect(await pendingMigrations(database.db)).toEqual([]);
      shapes[engine.engine] = await schemaShape(database.db);
      expect(Object.keys(shapes[engine.engine] ?? {}).sort()).toEqual([
        'access_tokens',
        'attempts',
        'audit_log',
        'calibration_items',
        'calibrations',
        'cohorts',
        'exposure_controls',
        'item_status_changes',
        'items',
        'pilot_items',
        'pilot_responses',
        'responses',
        'rubric_scores',
        'studies',
      ]);
    });

    it('uses only the portable column types, none unknown', () => {
      const types = Object.values(shapes[engine.engine] ?? {}).flatMap((t) =>
        Object.values(t).map((c) => c.type),
      );
      expect(types.filter((t) => t.startsWith('unknown'))).toEqual([]);
    });

    it('enforces one response per attempt and item, and foreign keys', async () => {
      const now = new Date().toISOString();
      await database.db
        .insertInto('studies')
        .values({
          id: 's1',
          title: 'Tide pools',
          settings: '{}',
          status: 'open',
          created_at: now,
          updated_at: now,
        })
        .execute();
      await database.db
        .insertInto('cohorts')
        .values({ id: 'c1', study_id: 's1', label: 'Walk-ups', join_code: 'KELP42', created_at: now })
        .execute();
      await database.db
        .insertInto('attempts')
        .values({
          id: 'a1',
          cohort_id: 'c1',
          token_hash: 'h1',
          status: 'started',
          form: '[]',
          background: '{}',
          started_at: now,
          last_seen_at: now,
        })
        .execute();
      const response = {
        attempt_id: 'a1',
        item_id: 'i1',
        item_version: 1,
        position: 0,
        answer_kind: 'answer' as const,
        answer: '"b"',
        score: 1,
        received_at: now,
      };
      await database.db
        .insertInto('responses')
        .values({ id: 'r1', ...response })
        .execute();
      await expect(
        database.db
          .insertInto('responses')
          .values({ id: 'r2', ...response })
          .execute(),
      ).rejects.toThrow();
      await expect(
        database.db
          .insertInto('responses')
          .values({ id: 'r3', ...response, attempt_id: 'no-such-attempt' })
          .execute(),
      ).rejects.toThrow();
      const stored = await database.db.selectFrom('responses').select(['id', 'score']).execute();
      expect(stored).toEqual([{ id: 'r1', score: 1 }]);
    });

    it('migrates down to zero and up again', async () => {
      await migrateDownToZero(database.db);
      const remaining = (await database.db.introspection.getTables()).filter(
        (t) => !t.name.startsWith('kysely_'),
      );
      expect(remaining).toEqual([]);
      await migrateToLatest(database.db);
      expect(await schemaShape(database.db)).toEqual(shapes[engine.engine]);
    });
  });
}

describe.skipIf(testEngines().some((e) => e.skipReason !== undefined))('both engines', () => {
  it('reach the same schema: tables, columns, types and nullability', () => {
    expect(shapes.sqlite).toBeDefined();
    expect(shapes.postgres).toEqual(shapes.sqlite);
  });
});
