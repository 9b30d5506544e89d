import { createHash, timingSafeEqual } from 'node:crypto';
import type { FastifyRequest } from 'fastify';

/** The token of an `Authorization: Bearer <token>` header, or undefined. */
export function bearerToken(request: FastifyRequest): string | undefined {
  const header = request.headers.authorization;
  if (typeof header !== 'string') return undefined;
  const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
  return match?.[1];
}

function digest(text: string): Buffer {
  return createHash('sha256').update(text, 'utf8').digest();
}

/**
 * Compares two secrets in constant time: SHA-256 digests first (equal length whatever the input),
 * then crypto.timingSafeEqual, so neither content nor length leaks through timing.
 */
export function secretsEqual(given: string, expected: string): boolean {
  return timingSafeEqual(digest(given), digest(expected));
}
