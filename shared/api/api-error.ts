import { z } from 'zod';

/** Every error code the API can answer with; the server maps each to one HTTP status. */
export const apiErrorCodes = {
  badRequest: 'bad_request',
  unauthenticated: 'unauthenticated',
  forbidden: 'forbidden',
  notFound: 'not_found',
  conflict: 'conflict',
  /** Well-formed, but the rules engine refused it (a profile gap, a wrong unit ...). */
  rulesRefused: 'rules_refused',
  payloadTooLarge: 'payload_too_large',
  /** A file of a kind the server does not keep (uploads take JPEG, PNG, WebP photos and PDFs). */
  unsupportedMediaType: 'unsupported_media_type',
  tooManyRequests: 'too_many_requests',
  unavailable: 'unavailable',
  internal: 'internal',
} as const;

export type ApiErrorCode = (typeof apiErrorCodes)[keyof typeof apiErrorCodes];

/** One problem with one input field, in words an official can act on. */
export const fieldProblemSchema = z.object({
  field: z.string(),
  message: z.string(),
});
export type FieldProblem = z.infer<typeof fieldProblemSchema>;

/** The body of every error answer: `{ error: { code, message, details } }`. */
export const apiErrorBodySchema = z.object({
  error: z.object({
    code: z.enum(Object.values(apiErrorCodes) as [ApiErrorCode, ...ApiErrorCode[]]),
    message: z.string().min(1),
    details: z.array(fieldProblemSchema),
  }),
});
export type ApiErrorBody = z.infer<typeof apiErrorBodySchema>;
