/**
 * A SQLite file with a simulated study on items of the real bank (./items), for CLI tests of
 * `calibrate --study` and `report`. Invented data: Rasch answers from chosen difficulties.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { loadBank } from '../../server/bank/load-bank.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { migrateToLatest } from '../../server/storage/migrate.js';
import { insertSimulatedStudy, normalDraws } from '../reports/simulated-study.js';

/** Generating difficulty by chart type and level: tables to read are easy, networks to envision hard. */
export const generatingDifficulty: Readonly<Record<string, number>> = {
  'table/read': -2.5,
  'network/read': -0.5,
  'table/interpret': 0,
  'network/envision': 3,
};

export interface StoredStudy {
  readonly folder: string;
  readonly url: string;
  readonly studyId: string;
  readonly cohortIds: string[];
}

/** Two cohorts of 40 respondents (means 0 and 0.5, SD 1) answering every chosen item. */
export async function storeSimulatedStudy(): Promise<StoredStudy> {
  const folder = mkdtempSync(path.join(tmpdir(), 'plotgauge-report-cli-'));
  const url = `sqlite:${path.join(folder, 'p.db')}`;
  const bank = await loadBank('items');
  const items = bank.items
    .filter((item) => item.status === 'active')
    .flatMap((item) => {
      const difficulty = generatingDifficulty[`${item.chart.type}/${item.level}`];
      return difficulty === undefined ? [] : [{ id: item.id, difficulty }];
    });
  const db = createDatabase(url);
  try {
    await migrateToLatest(db);
    const { studyId, cohortIds } = await insertSimulatedStudy(db, {
      items,
      seed: 77,
      cohorts: [
        { label: 'Harbour school', abilities: normalDraws(5, 40, 0, 1) },
        { label: 'Island library', abilities: normalDraws(6, 40, 0.5, 1) },
      ],
    });
    return { folder, url, studyId, cohortIds };
  } finally {
    await db.destroy();
  }
}
