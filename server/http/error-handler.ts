import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '../../shared/api/api-error';
import { RulesInputError } from '../../shared/rules/rules-error';
import { ApiError } from './api-error';

/** body-parser errors carry a `type`; these are the ones a client can cause and fix. */
function fromBodyParser(err: unknown): ApiError | undefined {
  if (typeof err !== 'object' || err === null || !('type' in err)) return undefined;
  switch (err.type) {
    case 'entity.too.large':
      return new ApiError('payload_too_large', 'The request is too large. Send fewer records at once.');
    case 'entity.parse.failed':
      return new ApiError('bad_request', 'The request body is not valid JSON.');
    default:
      return undefined;
  }
}

function fromRulesEngine(err: RulesInputError): ApiError {
  return new ApiError('rules_refused', err.message, err.details.map((detail) => ({ field: err.code, message: detail })));
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new ApiError('not_found', `There is no API route ${req.method} ${req.path}.`));
};

export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) {
    next(err);
    return;
  }
  const known = err instanceof ApiError ? err : err instanceof RulesInputError ? fromRulesEngine(err) : fromBodyParser(err);
  const apiError =
    known ?? new ApiError('internal', 'Something went wrong on the server. Nothing was saved by this request.');
  if (!known) req.log.error({ err }, 'unhandled error');
  const body: ApiErrorBody = {
    error: { code: apiError.code, message: apiError.message, details: apiError.details },
  };
  res.status(apiError.status).json(body);
};
