import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chartSpecSchema } from '../../server/charts/chart-spec.js';
import { renderChart } from '../../server/charts/render-chart.js';
import { validItem } from '../bank/valid-item.js';
import { admin, deliveryApp, studyWithCohort } from '../helpers/delivery-fixture.js';
import { type TestDatabase, testEngines } from '../helpers/test-databases.js';

/** An invented bar chart in the bank's format (the bank's own valid test item's chart). */
const chart = () => structuredClone(validItem().chart) as Record<string, unknown>;
const body = (overrides: Record<string, unknown> = {}) => ({
  prompt: 'On which day did the ferry carry the most people?',
  alt: 'Bar chart of ferry passengers on four days, Monday to Thursday, on a scale from 0 to 400 people.',
  options: [
    { id: 'mon', text: 'Monday' },
    { id: 'tue', text: 'Tuesday' },
  ],
  key: 'tue',
  chart: chart(),
  minResponses: 40,
  ...overrides,
});

for (const engine of testEngines()) {
  describe.skipIf(engine.skipReason !== undefined)(
    `${engine.engine}: pilots in the bank's chart format`,
    () => {
      let database: TestDatabase;
      let app: FastifyInstance;
      let studyId = '';
      beforeAll(async () => {
        database = await engine.open();
        app = await deliveryApp(database);
        studyId = (await studyWithCohort(app)).studyId;
      });
      afterAll(async () => {
        await app?.close();
        await database?.cleanup();
      });
      const post = (payload: object) =>
        request(app.server).post(`/api/admin/studies/${studyId}/pilots`).set(admin).send(payload);
      const pilotCount = async () =>
        (await database.db.selectFrom('pilot_items').select('id').where('study_id', '=', studyId).execute())
          .length;

      it('draws the spec with the bank renderer and stores that SVG', async () => {
        const added = await post(body());
        expect(added.status).toBe(201);
        expect(added.body).toMatchObject({ mediaType: 'image/svg+xml', sanitized: false, minResponses: 40 });
        const stored = await database.db
          .selectFrom('pilot_items')
          .select('image')
          .where('id', '=', added.body.id)
          .executeTakeFirstOrThrow();
        const svg = Buffer.from(stored.image, 'base64').toString('utf8');
        // Byte for byte what the bank's renderer draws for this spec and alt text.
        expect(svg).toBe(
          renderChart(chartSpecSchema.parse(validItem().chart), {
            description: body().alt,
            idPrefix: 'pilot-',
          }),
        );
        expect(svg).toContain('role="img"');
        expect(svg.match(/class="mark bar"/g)).toHaveLength(4);
        const audit = await database.db
          .selectFrom('audit_log')
          .select('details')
          .where('action', '=', 'pilot.add')
          .execute();
        expect(audit.map((a) => JSON.parse(a.details).format)).toContain('chart');
      });

      const refusals: [string, Record<string, unknown>, string, RegExp][] = [
        ['an unknown chart type', { chart: { ...chart(), type: 'radar' } }, 'body.chart.type', /./],
        [
          'an encoding naming a field that is not described',
          { chart: { ...chart(), value: 'riders' } },
          'body.chart.value',
          /names field "riders", which is not in chart.fields/,
        ],
        [
          'a row with text where a number belongs',
          {
            chart: {
              ...chart(),
              data: [
                { day: 'Mon', passengers: 'many' },
                { day: 'Tue', passengers: 340 },
              ],
            },
          },
          'body.chart.data.0.passengers',
          /./,
        ],
        [
          'a colour too faint against the background (WCAG 2.1 SC 1.4.11 needs 3:1)',
          { chart: { ...chart(), colours: ['#f4f4f4'] } },
          'body.chart.colours.0',
          /3:1/,
        ],
        [
          'alt text too short to describe the chart',
          { alt: 'Ferry chart.' },
          'body.alt',
          /needs at least 40/,
        ],
        [
          'alt text naming the key but not the other option',
          {
            alt: 'Bar chart of ferry passengers on four days; Tuesday stands out on a scale from 0 to 400 people.',
          },
          'body.alt',
          /names the key "Tuesday"/,
        ],
        [
          'both an image and a chart',
          {
            image: {
              type: 'image/svg+xml',
              base64: Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"/>').toString('base64'),
            },
          },
          'body.image',
          /exactly one of image and chart/,
        ],
        [
          'neither an image nor a chart',
          { chart: undefined },
          'body.image',
          /exactly one of image and chart/,
        ],
      ];
      for (const [what, overrides, field, message] of refusals) {
        it(`refuses ${what}: 400 naming ${field}, nothing stored`, async () => {
          const before = await pilotCount();
          const reply = await post(body(overrides));
          expect(reply.status).toBe(400);
          expect(reply.body.error.code).toBe('VALIDATION_FAILED');
          const problems = reply.body.error.details.problems as {
            field: string;
            problem?: string;
            message?: string;
          }[];
          const named = problems.find((p) => p.field === field);
          expect(named, JSON.stringify(problems)).toBeDefined();
          expect(named!.problem ?? named!.message ?? '').toMatch(message);
          expect(await pilotCount()).toBe(before);
        });
      }

      it('refuses a map chart whose stored map the bank does not have (400 naming body.chart.map)', async () => {
        const reply = await post(
          body({
            chart: {
              type: 'choropleth-map',
              title: 'Rain by district',
              map: 'nowhere-map',
              fields: [
                { name: 'district', kind: 'nominal', label: 'District' },
                { name: 'rain', kind: 'quantitative', label: 'Rain', unit: 'mm' },
              ],
              data: [{ district: 'harbour', rain: 12 }],
              region: 'district',
              value: 'rain',
            },
          }),
        );
        expect(reply.status).toBe(400);
        expect(reply.body.error.details.problems.map((p: { field: string }) => p.field)).toContain(
          'body.chart.map',
        );
      });
    },
  );
}
