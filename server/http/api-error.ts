import type { ApiErrorCode, FieldProblem } from '../../shared/api/api-error';

const statusByCode: Record<ApiErrorCode, number> = {
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  rules_refused: 422,
  payload_too_large: 413,
  unsupported_media_type: 415,
  too_many_requests: 429,
  unavailable: 503,
  internal: 500,
};

/** An error the API answers with as `{ error: { code, message, details } }`. */
export class ApiError extends Error {
  readonly status: number;

  constructor(
    readonly code: ApiErrorCode,
    message: string,
    readonly details: FieldProblem[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
    this.status = statusByCode[code];
  }
}
