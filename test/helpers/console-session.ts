import type { FastifyInstance } from 'fastify';
import request from 'supertest';
import { expect } from 'vitest';

/** Signs in through the console's sign-in form with a team token; returns the session cookie (name=value). */
export async function signInToConsole(app: FastifyInstance, token: string): Promise<string> {
  const reply = await request(app.server).post('/sign-in').type('form').send({ token, next: '/console' });
  expect(reply.status).toBe(303);
  return String(reply.headers['set-cookie']).split(';')[0]!;
}

/** The CSRF token a console page carries (body data-csrf and each form's hidden field). */
export function csrfOf(page: string): string {
  const match = /data-csrf="([^"]+)"/.exec(page);
  if (!match) throw new Error('no CSRF token on the page');
  return match[1]!;
}
