import type { Config } from '../config.js';

/**
 * The base of join links: PUBLIC_URL when set, else http://HOST:PORT (with 127.0.0.1 for a
 * server listening on every address, which is no address a phone can open).
 */
export function publicBaseUrl(config: Pick<Config, 'publicUrl' | 'host' | 'port'>): string {
  if (config.publicUrl !== undefined) return config.publicUrl.replace(/\/+$/, '');
  const host = config.host === '0.0.0.0' || config.host === '::' ? '127.0.0.1' : config.host;
  return `http://${host.includes(':') ? `[${host}]` : host}:${config.port}`;
}
