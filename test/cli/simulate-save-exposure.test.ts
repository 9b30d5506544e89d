import { rmSync } from 'node:fs';
import { Command } from 'commander';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBank } from '../../server/bank/load-bank.js';
import { registerSimulateCommand, runSimulateAdaptive } from '../../server/cli/simulate-command.js';
import { loadAdaptiveDelivery, needsCalibrationMessage } from '../../server/delivery/adaptive-delivery.js';
import { parseStudySettings } from '../../server/delivery/attempt-service.js';
import { deliveryBankFrom } from '../../server/delivery/bank-adapter.js';
import { calibrateStudy } from '../../server/reports/calibrate-study.js';
import { createDatabase } from '../../server/storage/create-database.js';
import { listStudyExposureControls } from '../../server/storage/exposure-control-repository.js';
import { findStudyById, updateStudy } from '../../server/storage/study-repository.js';
import { capturedOutput } from '../helpers/run-cli.js';
import { insertSimulatedStudy } from '../reports/simulated-study.js';
import { type StoredStudy, storeSimulatedStudy } from './stored-study.js';

/** `simulate adaptive --study <id> --save-exposure-control`: tunes and stores for live attempts. */
describe('simulate adaptive --save-exposure-control', () => {
  let stored: StoredStudy;
  let calibrationId: string;
  const bank = () => loadBank('items');

  beforeAll(async () => {
    stored = await storeSimulatedStudy();
    const db = createDatabase(stored.url);
    try {
      const calibration = await calibrateStudy(db, stored.studyId, { replicates: 5 });
      expect(calibration.record.converged).toBe(true);
      calibrationId = calibration.record.id;
      const study = (await findStudyById(db, stored.studyId))!;
      // 10 calibrated items, attempts of 2: the mean exposure (0.2) leaves room below 0.3, and
      // randomesque k = 2 alone gives the two items nearest each prior to most persons.
      await updateStudy(db, stored.studyId, {
        title: study.title,
        status: study.status,
        at: new Date().toISOString(),
        settings: {
          title: study.title,
          pool: { itemIds: calibration.items.map((item) => item.itemId) },
          design: 'adaptive',
          maxItems: 2,
          adaptive: { seTarget: 0.6, minItems: 1, randomesque: 2, contentBalance: 'none' },
        },
      });
    } finally {
      await db.destroy();
    }
  }, 60000);

  afterAll(() => {
    if (stored) rmSync(stored.folder, { recursive: true, force: true });
  });

  it('tunes, stores, prints what it stored, and new attempts start with it', {
    timeout: 120000,
  }, async () => {
    const { out, output } = capturedOutput();
    const run = await runSimulateAdaptive(
      { study: stored.studyId, database: stored.url, persons: 60, seed: 3, saveExposureControl: true },
      { ...output, loadBank: bank },
    );
    const text = out.join('');
    const db = createDatabase(stored.url);
    try {
      const controls = await listStudyExposureControls(db, stored.studyId);
      expect(controls).toHaveLength(1);
      const control = controls[0]!;
      expect(control.calibrationId).toBe(calibrationId);
      expect(control.createdBy).toBe('cli');
      expect(control.simulation).toMatchObject({
        outcome: 'tuned',
        seed: 3,
        personsPerAudience: 60,
        rounds: 12,
      });
      expect(Object.keys(control.itemParameters).sort()).toEqual([...run.bank.ids].sort());
      const ks = Object.values(control.itemParameters);
      const below = ks.filter((k) => k < 1);
      expect(below.length).toBeGreaterThan(0);
      // The stored largest exposure is the one the printed table ends with (the tuned run).
      expect(control.achievedMaxExposure).toBe(run.result.maxExposure);
      expect(text).toContain(
        `Stored exposure control ${control.id} for study ${stored.studyId}, calibration ${calibrationId}: ` +
          `K < 1 for ${below.length} of 10 items (smallest ${Math.min(...ks).toFixed(3)}); ` +
          `target 0.3, largest exposure in simulation ${control.achievedMaxExposure.toFixed(3)}.`,
      );
      const audit = await db
        .selectFrom('audit_log')
        .selectAll()
        .where('action', '=', 'exposure-control.save')
        .execute();
      expect(audit.map((a) => [a.actor, a.subject])).toEqual([['cli', stored.studyId]]);
      // What a join builds now starts with this control.
      const study = (await findStudyById(db, stored.studyId))!;
      const delivery = await loadAdaptiveDelivery(
        db,
        deliveryBankFrom(await bank(), () => {
          throw new Error('not rendered');
        }),
        stored.studyId,
        parseStudySettings(study),
      );
      expect(delivery.exposureControlId).toBe(control.id);
    } finally {
      await db.destroy();
    }
  });

  it('refuses --save-exposure-control without --study, with overridden settings, and without tuning', async () => {
    const { output } = capturedOutput();
    const withBank = { ...output, loadBank: bank };
    await expect(runSimulateAdaptive({ bankSize: 20, saveExposureControl: true }, withBank)).rejects.toThrow(
      '--save-exposure-control needs --study <id>',
    );
    for (const override of [
      { seTarget: 0.5 },
      { maxItems: 3 },
      { balance: 'level' as const },
      { noExposureControl: true },
    ]) {
      await expect(
        runSimulateAdaptive(
          { study: stored.studyId, database: stored.url, saveExposureControl: true, ...override },
          withBank,
        ),
      ).rejects.toThrow("--save-exposure-control tunes for the study's own adaptive settings");
    }
    await expect(
      runSimulateAdaptive(
        { study: 'no-such-study', database: stored.url, saveExposureControl: true },
        withBank,
      ),
    ).rejects.toThrow('--study: there is no study no-such-study');
    for (const maxExposure of [0, -0.2, 1.5]) {
      await expect(
        runSimulateAdaptive(
          { study: stored.studyId, database: stored.url, saveExposureControl: true, maxExposure },
          withBank,
        ),
      ).rejects.toThrow('--max-exposure must be a number in (0, 1]');
    }
    // A study without a calibration: the same one-line refusal as a join, nothing stored.
    const db = createDatabase(stored.url);
    const { studyId } = await insertSimulatedStudy(db, {
      items: [{ id: (await bank()).items.find((i) => i.status === 'active')!.id, difficulty: 0 }],
      cohorts: [],
      seed: 1,
    }).finally(() => db.destroy());
    await expect(
      runSimulateAdaptive({ study: studyId, database: stored.url, saveExposureControl: true }, withBank),
    ).rejects.toThrow(needsCalibrationMessage);
    const check = createDatabase(stored.url);
    expect(await listStudyExposureControls(check, studyId).finally(() => check.destroy())).toEqual([]);
    const program = new Command('plotgauge').exitOverride();
    registerSimulateCommand(program);
    await expect(
      program.parseAsync(['simulate', 'adaptive', '--bank-size', '20', '--save-exposure-control'], {
        from: 'user',
      }),
    ).rejects.toThrow('--save-exposure-control needs --study <id>');
  });
});
