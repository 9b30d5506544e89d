import { z } from 'zod';
import { errorCodes } from '../errors.js';

/** The error body every route may answer with; used in response schemas and the OpenAPI document. */
export const errorBodySchema = z.object({
  error: z.object({
    code: z.enum(Object.keys(errorCodes) as [keyof typeof errorCodes, ...(keyof typeof errorCodes)[]]),
    message: z.string(),
    details: z.record(z.string(), z.unknown()),
  }),
});

/** Path parameters of a route under one study. */
export const studyParams = z.object({ studyId: z.string().min(1).max(100) });

/** The refusals a team route may answer with: bad input, signed out, not allowed, not found, conflict. */
export const teamRouteErrors = {
  400: errorBodySchema,
  401: errorBodySchema,
  403: errorBodySchema,
  404: errorBodySchema,
  409: errorBodySchema,
};
