import { createHash } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { z } from 'zod';
import { signedIn } from '../auth/access';
import { requireAuth } from '../auth/request-auth';
import type { Database } from '../db/client';
import { ApiError } from '../http/api-error';
import type { ApiRoute } from '../http/api-route';
import { parseInput } from '../http/parse-input';
import { contentDispositionOf, labelOf, matchesContentType, uploadContentTypeOf } from './file-kinds';
import { hasStoredFile, storeFile, uploadPath } from './upload-files';
import { findUpload, recordUpload } from './upload-rows';
import { fileBodyReader } from './read-file-body';

export interface UploadSettings {
  /** Folder the files are kept in, `<RIMELOG_DATA_DIR>/uploads` in production. */
  dir: string;
  /** Largest file accepted, in bytes. */
  limitBytes: number;
}

// Only the exact form the device sends: this also keeps "..", slashes and any other path trick out of
// the file name built from it.
const uploadParamsSchema = z.object({
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'this is not a file fingerprint: it must be 64 characters, each 0-9 or a-f'),
});

const notConfigured = () =>
  new ApiError('unavailable', 'This server has no folder for photos and certificates, so it cannot take or show them now. The device keeps them and tries again.');

const notHere = () =>
  new ApiError('not_found', 'The server does not have this file yet. The device that took it will send it when it syncs.');

/**
 * `PUT /api/uploads/:sha256` stores a photo or certificate under its SHA-256; `GET` sends it back, and
 * `HEAD` (Express answers it with the GET route, headers only) says whether the server has it.
 *
 * Resuming after an interruption: the device asks HEAD for each file in its photo queue and sends
 * again, whole, only those that answer 404. Files are at most RIMELOG_UPLOAD_LIMIT_MB (10 MB by
 * default) and photos about 1600 px JPEGs, so resending a whole file is cheaper than tracking byte
 * ranges; a half-received file is never stored, since nothing is written before the hash matches.
 */
export function uploadRoutes(db: Database, settings: UploadSettings | undefined): ApiRoute[] {
  const readBody = fileBodyReader(settings?.limitBytes ?? 0);
  return [
    {
      method: 'put',
      path: '/uploads/:sha256',
      access: signedIn,
      handle: async (req, res) => {
        const { user } = requireAuth(res);
        const { sha256 } = parseInput(uploadParamsSchema, req.params, 'params');
        if (!settings) throw notConfigured();
        const contentType = uploadContentTypeOf(req.headers['content-type']);
        if (!contentType) {
          throw new ApiError(
            'unsupported_media_type',
            'Only photos (JPEG, PNG or WebP) and PDF certificates can be uploaded; this file is of another kind, so it was not kept.',
          );
        }
        const bytes = await readBody(req, res);
        if (bytes.length === 0 || createHash('sha256').update(bytes).digest('hex') !== sha256) {
          throw new ApiError('bad_request', 'The file arrived damaged; the device will send it again.');
        }
        if (!matchesContentType(contentType, bytes)) {
          throw new ApiError('unsupported_media_type', `This file is not the ${labelOf(contentType)} it was sent as, so it was not kept.`);
        }
        // The file goes first: a row always means a complete file, and a file left without its row
        // (a crash in between) gets the row when the device sends it again.
        if (!(await hasStoredFile(settings.dir, sha256))) await storeFile(settings.dir, sha256, bytes);
        const { created, receipt } = await recordUpload(db, { sha256, contentType, sizeBytes: bytes.length, uploadedBy: user.id });
        if (created) res.location(`/api/uploads/${sha256}`);
        res.status(created ? 201 : 200).json(receipt);
      },
    },
    {
      method: 'get',
      path: '/uploads/:sha256',
      access: signedIn,
      handle: async (req, res, next) => {
        const { sha256 } = parseInput(uploadParamsSchema, req.params, 'params');
        if (!settings) throw notConfigured();
        const upload = await findUpload(db, sha256);
        if (!upload || !(await hasStoredFile(settings.dir, sha256))) throw notHere();
        res.setHeader('Content-Type', upload.contentType);
        // The name is the content's hash, so what is cached can never go stale.
        res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
        res.setHeader('ETag', `"${sha256}"`);
        res.setHeader('X-Content-Type-Options', 'nosniff');
        res.setHeader('Content-Disposition', contentDispositionOf(upload.contentType, sha256));
        sendStoredFile(req, res, next, uploadPath(settings.dir, sha256));
      },
    },
  ];
}

/** Streams the file (ranges, conditional requests and HEAD handled by Express's sendFile). */
function sendStoredFile(req: Request, res: Response, next: NextFunction, file: string): void {
  // `dotfiles: 'allow'`: the uploads folder sits under `.data`, which send would otherwise refuse.
  res.sendFile(file, { cacheControl: false, dotfiles: 'allow' }, (error?: Error & { code?: string }) => {
    if (!error) return;
    if (res.headersSent) {
      req.log.warn({ err: error }, 'sending an upload stopped early');
      return;
    }
    next(error.code === 'ENOENT' ? notHere() : error);
  });
}
