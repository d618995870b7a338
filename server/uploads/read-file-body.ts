import express, { type Request, type Response } from 'express';
import { ApiError } from '../http/api-error';

const megabytes = (bytes: number): string => `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;

/** body-parser's errors for a raw upload, in words; anything else goes to the error handler as it is. */
function inWords(error: unknown, limitBytes: number): unknown {
  const type = typeof error === 'object' && error !== null && 'type' in error ? error.type : undefined;
  switch (type) {
    case 'entity.too.large':
      return new ApiError(
        'payload_too_large',
        `The file is larger than ${megabytes(limitBytes)}, the most this server keeps. Take the photo again, or scan the certificate at a lower resolution.`,
      );
    case 'request.size.invalid':
    case 'request.aborted':
      return new ApiError('bad_request', 'The file arrived damaged; the device will send it again.');
    case 'encoding.unsupported':
      return new ApiError('unsupported_media_type', 'The file was sent compressed in a way this server cannot read; send it as it is.');
    default:
      return error;
  }
}

/**
 * Reads the whole request body into memory, up to the limit (express.raw, i.e. body-parser). Uploads
 * are at most a few MB, so holding one in memory to hash it before anything is written is fine.
 */
export function fileBodyReader(limitBytes: number): (req: Request, res: Response) => Promise<Buffer> {
  const parse = express.raw({ type: () => true, limit: limitBytes });
  return (req, res) =>
    new Promise((resolve, reject) => {
      parse(req, res, (error?: unknown) => {
        if (error) return reject(inWords(error, limitBytes));
        resolve(Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0));
      });
    });
}
