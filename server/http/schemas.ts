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
