import { Writable } from 'node:stream';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.js';
import { loadConfig } from '../../server/config.js';
import { createDatabase } from '../../server/storage/create-database.js';

describe('request log', () => {
  it('records id, method and path, but no query string, body, header or client address', async () => {
    const lines: string[] = [];
    const stream = new Writable({
      write(chunk, _encoding, done) {
        lines.push(String(chunk));
        done();
      },
    });
    const url = 'sqlite::memory:';
    const db = createDatabase(url);
    const app = await buildApp({
      config: loadConfig({}, { databaseUrl: url }),
      db,
      logger: { level: 'info', stream },
    });
    await app.ready();
    await request(app.server)
      .post('/nowhere?code=JOINCODE77')
      .set('authorization', 'Bearer tok-SECRET-123')
      .send({ answer: 'ANSWER-b' });
    await app.close();
    await db.destroy();
    const log = lines.join('');
    expect(log).toContain('"path":"/nowhere"');
    expect(log).toContain('"method":"POST"');
    for (const secret of ['JOINCODE77', 'tok-SECRET-123', 'ANSWER-b', 'remoteAddress', '127.0.0.1']) {
      expect(log).not.toContain(secret);
    }
  });
});
