import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../server/config.js';

describe('loadConfig', () => {
  it('gives the documented defaults for an empty environment', () => {
    expect(loadConfig({})).toEqual({
      port: 8080,
      host: '127.0.0.1',
      databaseUrl: 'sqlite:./data/plotgauge.db',
      logLevel: 'info',
      sqliteSync: 'full',
      itemsDir: './items',
      rateLimitJoin: 120,
      rateLimitAnswers: 1200,
    });
  });

  it('reads the environment, and flags override it', () => {
    const config = loadConfig({ PORT: '9000', DATABASE_URL: 'postgres://db.local/pg' }, { port: '9100' });
    expect(config.port).toBe(9100);
    expect(config.databaseUrl).toBe('postgres://db.local/pg');
    expect(Object.isFrozen(config)).toBe(true);
  });

  it.each([
    [{ PORT: 'eighty' }, 'PORT: must be a whole number (got "eighty")'],
    [{ PORT: '70000' }, 'PORT: must be between 0 and 65535 (got "70000")'],
    [{ PORT: '80.5' }, 'PORT: must be a whole number (got "80.5")'],
    [{ DATABASE_URL: 'mysql://x/y' }, 'DATABASE_URL: must start with sqlite:'],
    [{ DATABASE_URL: '' }, 'DATABASE_URL: must not be empty'],
    [{ LOG_LEVEL: 'loud' }, 'LOG_LEVEL: must be one of fatal, error, warn, info, debug, trace, silent'],
    [{ SQLITE_SYNC: 'off' }, 'SQLITE_SYNC: must be full or normal'],
  ])('rejects %j with one line naming the variable', (env, message) => {
    expect(() => loadConfig(env)).toThrow(ConfigError);
    expect(() => loadConfig(env)).toThrow(message);
  });
});
