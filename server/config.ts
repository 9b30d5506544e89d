import { isIP } from 'node:net';
import { z } from 'zod';

/**
 * The server's configuration: read once from the environment (and command-line flags, which
 * override it), validated with zod, frozen. Nothing else reads `process.env`.
 */

export const logLevels = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;

const databaseUrlSchema = z
  .string()
  .min(1, 'must not be empty')
  .refine((value) => /^(sqlite:|postgres:\/\/|postgresql:\/\/)/.test(value), {
    message: 'must start with sqlite: (for example sqlite:./data/plotgauge.db) or postgres://',
  });

/** proxy-addr's (fastify's) names for address ranges, allowed in TRUST_PROXY beside addresses. */
const proxyRangeNames = ['loopback', 'linklocal', 'uniquelocal'];

function isAddressOrRange(entry: string): boolean {
  if (proxyRangeNames.includes(entry)) return true;
  const [address = '', prefix, ...rest] = entry.split('/');
  const version = isIP(address);
  if (version === 0 || rest.length > 0) return false;
  if (prefix === undefined) return true;
  return /^\d{1,3}$/.test(prefix) && Number(prefix) <= (version === 4 ? 32 : 128);
}

/**
 * TRUST_PROXY: the reverse proxies that may name the client (X-Forwarded-For), so rate limits key on
 * the real client: a comma-separated list of IPs, CIDR ranges, or `loopback`, `linklocal`,
 * `uniquelocal` (fastify's `trustProxy` as an address list). Refused: `true` (trust everyone: any
 * client could choose the address it is limited by) and a hop count (fastify 5 no longer honours
 * one: it cannot check the proxy in front, so it trusts nothing).
 */
const trustProxySchema = z.string().transform((value, context): string[] => {
  const entries = value.split(',').map((entry) => entry.trim());
  if (entries.every((entry) => entry !== '' && isAddressOrRange(entry))) return entries;
  context.addIssue({
    code: 'custom',
    message:
      "must list the proxies' addresses or CIDR ranges, comma-separated (e.g. 127.0.0.1 or 10.0.0.0/8); not true and not a hop count",
  });
  return z.NEVER;
});

export const configSchema = z.strictObject({
  port: z.coerce
    .number({ message: 'must be a whole number' })
    .int('must be a whole number')
    .min(0, 'must be between 0 and 65535')
    .max(65535, 'must be between 0 and 65535'),
  host: z.string().min(1, 'must not be empty'),
  databaseUrl: databaseUrlSchema,
  logLevel: z.enum(logLevels, { message: `must be one of ${logLevels.join(', ')}` }),
  /**
   * SQLite `synchronous` setting. `full` (default) makes every acknowledged commit survive both
   * a killed process and a power cut; `normal` survives a killed process only. See DEVELOPERS.md.
   */
  sqliteSync: z.enum(['full', 'normal'], { message: 'must be full or normal' }),
  /** Folder of the item bank (JSON item files, scenarios, maps). */
  itemsDir: z.string().min(1, 'must not be empty'),
  /**
   * Bearer token of the admin API (at least 16 characters). Unset: the admin API answers 401 and
   * says to set ADMIN_TOKEN. The CLI does not need it.
   */
  adminToken: z.string().min(16, 'must be at least 16 characters').optional(),
  /** Joins per client address per minute (0: no limit); see server/http/access-limits.ts. */
  rateLimitJoin: z.coerce.number({ message: 'must be a whole number' }).int('must be a whole number').min(0),
  /** Respondent requests per client address per minute (0: no limit). */
  rateLimitAnswers: z.coerce
    .number({ message: 'must be a whole number' })
    .int('must be a whole number')
    .min(0),
  /** Days after which background answers are dropped (at start-up and `plotgauge retention apply`); unset: kept. */
  retentionDays: z.coerce
    .number({ message: 'must be a whole number' })
    .int('must be a whole number')
    .min(1)
    .optional(),
  /** Base of join links and QR codes, e.g. https://survey.example.org; default http://HOST:PORT. */
  publicUrl: z.url({ message: 'must be an http(s) URL' }).optional(),
  /** Reverse proxies trusted to name the client; unset: none (the connection's address counts). */
  trustProxy: trustProxySchema.optional(),
});

export type Config = Readonly<z.infer<typeof configSchema>>;

/** Which environment variable feeds which config key; also the README's configuration table. */
export const environmentVariables = {
  port: { name: 'PORT', default: '8080', meaning: 'TCP port the server listens on' },
  host: { name: 'HOST', default: '127.0.0.1', meaning: 'address to listen on (0.0.0.0 for a kiosk network)' },
  databaseUrl: {
    name: 'DATABASE_URL',
    default: 'sqlite:./data/plotgauge.db',
    meaning: 'sqlite:<file> (embedded) or postgres://user@host:port/db',
  },
  logLevel: { name: 'LOG_LEVEL', default: 'info', meaning: logLevels.join(', ') },
  sqliteSync: { name: 'SQLITE_SYNC', default: 'full', meaning: 'full (survives power cuts) or normal' },
  itemsDir: { name: 'ITEMS_DIR', default: './items', meaning: 'folder of the item bank' },
  adminToken: {
    name: 'ADMIN_TOKEN',
    default: '',
    meaning: 'bearer token of the admin API (16+ characters); unset: admin API off',
  },
  rateLimitJoin: {
    name: 'RATE_LIMIT_JOIN',
    default: '120',
    meaning: 'joins per client address per minute; 0 turns the limit off',
  },
  rateLimitAnswers: {
    name: 'RATE_LIMIT_ANSWERS',
    default: '1200',
    meaning: 'respondent requests (answers, steps) per client address per minute; 0: off',
  },
  retentionDays: {
    name: 'RETENTION_DAYS',
    default: '',
    meaning:
      'days after which background answers are dropped (at start-up and by retention apply); unset: kept',
  },
  publicUrl: {
    name: 'PUBLIC_URL',
    default: '',
    meaning: 'base URL of join links and QR codes; default http://HOST:PORT',
  },
  trustProxy: {
    name: 'TRUST_PROXY',
    default: '',
    meaning:
      'addresses or CIDR ranges of reverse proxies trusted to name the client (X-Forwarded-For); unset: none',
  },
} as const satisfies Record<keyof Config, { name: string; default: string; meaning: string }>;

/** A configuration problem, reported as one line naming the variable and the problem. */
export class ConfigError extends Error {
  override readonly name = 'ConfigError';
}

type Overrides = Partial<Record<keyof Config, string | undefined>>;

/**
 * Builds the configuration from an environment object and flag overrides.
 * @throws {ConfigError} naming the first offending variable, e.g. `PORT: must be between 0 and 65535`
 */
export function loadConfig(
  env: NodeJS.ProcessEnv | Record<string, string | undefined>,
  overrides: Overrides = {},
): Config {
  const raw: Record<string, string> = {};
  for (const [key, variable] of Object.entries(environmentVariables) as [
    keyof Config,
    { name: string; default: string },
  ][]) {
    const value = overrides[key] ?? env[variable.name] ?? variable.default;
    // An optional setting (documented default '') left empty means "not set".
    if (value === '' && variable.default === '') continue;
    raw[key] = value;
  }
  const parsed = configSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const key = issue?.path[0] as keyof Config | undefined;
    const name = key ? environmentVariables[key].name : 'configuration';
    // Secrets are never echoed back.
    const got = key === 'adminToken' ? '' : ` (got ${JSON.stringify(key ? raw[key] : '')})`;
    throw new ConfigError(`${name}: ${issue?.message ?? 'invalid'}${got}`);
  }
  return Object.freeze(parsed.data);
}
