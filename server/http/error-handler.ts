import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { hasZodFastifySchemaValidationErrors, isResponseSerializationError } from 'fastify-type-provider-zod';
import { AppError, type ErrorBody, type ErrorCode, errorCodes } from '../errors.js';
import { renderErrorPage } from '../pages/error-page.js';
import { consolePages } from './access-policy.js';

/** One field problem: where (`body.title`) and what is wrong with it. */
export interface FieldProblem {
  field: string;
  problem: string;
}

function send(reply: FastifyReply, code: ErrorCode, message: string, details: Record<string, unknown> = {}) {
  const status = errorCodes[code].status;
  if (status < 500 && wantsPage(reply.request)) {
    return reply.code(status).type('text/html; charset=utf-8').send(renderErrorPage({ status, message }));
  }
  const body: ErrorBody = { error: { code, message, details } };
  return reply.code(status).type('application/json; charset=utf-8').send(body);
}

/** A browser asking for a console or report page (GET, HTML accepted) gets a page instead of JSON. */
function wantsPage(request: FastifyRequest): boolean {
  if (request.method !== 'GET' && request.method !== 'HEAD') return false;
  const url = request.routeOptions?.url;
  if (url === undefined || !consolePages.has(`GET ${url}`)) return false;
  return (request.headers.accept ?? '').includes('text/html');
}

const fastifyCodeMap: Partial<Record<string, ErrorCode>> = {
  FST_ERR_CTP_INVALID_JSON_BODY: 'INVALID_JSON',
  FST_ERR_CTP_EMPTY_JSON_BODY: 'EMPTY_BODY',
  FST_ERR_CTP_BODY_TOO_LARGE: 'BODY_TOO_LARGE',
  FST_ERR_CTP_INVALID_MEDIA_TYPE: 'UNSUPPORTED_MEDIA_TYPE',
  FST_ERR_CTP_INVALID_CONTENT_LENGTH: 'VALIDATION_FAILED',
  FST_ERR_VALIDATION: 'VALIDATION_FAILED',
};

const plainMessages: Partial<Record<ErrorCode, string>> = {
  INVALID_JSON: 'The body is not valid JSON.',
  EMPTY_BODY: 'The body is empty; send a JSON object.',
  BODY_TOO_LARGE: 'The body is too large for this route.',
  UNSUPPORTED_MEDIA_TYPE: 'Send the body as application/json.',
  RATE_LIMITED: 'Too many requests; wait a moment and try again.',
};

const databaseDownCodes = new Set([
  'ECONNREFUSED',
  'ENOTFOUND',
  'ETIMEDOUT',
  '57P01',
  '57P03',
  '08006',
  '08001',
]);

/** Turns the issues of a zod validation error into `field: problem` pairs. */
function fieldProblems(error: FastifyError): FieldProblem[] {
  const context = error.validationContext ?? 'body';
  return (error.validation ?? []).map((issue) => {
    const rawPath = (issue as { instancePath?: string; params?: { issue?: { path?: PropertyKey[] } } }).params
      ?.issue?.path;
    const path = rawPath ? rawPath.map(String) : (issue.instancePath ?? '').split('/').filter(Boolean);
    return { field: [context, ...path].join('.'), problem: issue.message ?? 'is invalid' };
  });
}

/**
 * The one error handler: every failure becomes `{ error: { code, message, details } }`.
 * Client mistakes get a 4xx naming the field; anything unexpected is logged and answered as
 * 500 INTERNAL_ERROR without its message, stack or SQL.
 */
export function errorHandler(error: FastifyError, request: FastifyRequest, reply: FastifyReply) {
  if (error instanceof AppError) return send(reply, error.code, error.message, error.details);

  if (hasZodFastifySchemaValidationErrors(error)) {
    const problems = fieldProblems(error);
    const first = problems[0];
    const message = first ? `${first.field}: ${first.problem}` : 'The request does not match its schema.';
    return send(reply, 'VALIDATION_FAILED', message, { problems });
  }

  if (isResponseSerializationError(error)) {
    request.log.error({ err: error }, 'response did not match its schema');
    return send(reply, 'INTERNAL_ERROR', 'The server made an error; it has been logged.');
  }

  const mapped = error.code ? fastifyCodeMap[error.code] : undefined;
  if (mapped) return send(reply, mapped, plainMessages[mapped] ?? error.message);
  if (error instanceof SyntaxError && error.statusCode === 400)
    return send(reply, 'INVALID_JSON', plainMessages.INVALID_JSON!);
  if (error.statusCode === 429) return send(reply, 'RATE_LIMITED', plainMessages.RATE_LIMITED!);

  if (error.code && databaseDownCodes.has(error.code)) {
    request.log.error({ err: error }, 'database unavailable');
    return send(reply, 'DATABASE_UNAVAILABLE', 'The database cannot be reached; try again shortly.');
  }

  if (error.statusCode && error.statusCode >= 400 && error.statusCode < 500) {
    const code: ErrorCode = error.statusCode === 404 ? 'NOT_FOUND' : 'VALIDATION_FAILED';
    return send(reply, code, error.message);
  }

  request.log.error({ err: error }, 'unhandled error');
  return send(reply, 'INTERNAL_ERROR', 'The server made an error; it has been logged.');
}

/** Unknown routes: 404 naming the method and path. */
export function notFoundHandler(request: FastifyRequest, reply: FastifyReply) {
  const path = request.url.split('?')[0];
  return send(reply, 'NOT_FOUND', `No route ${request.method} ${path}.`);
}

/** Registers both handlers on an app (or an encapsulated plugin that needs its own). */
export function registerErrorHandlers(app: FastifyInstance): void {
  app.setErrorHandler(errorHandler);
  app.setNotFoundHandler(notFoundHandler);
}
