import os from 'node:os';
import multer from 'multer';
import type { NextFunction, Request, Response } from 'express';
import { AppError, validationFailed } from '../errors';

/**
 * One large file (a bag) from a multipart field, streamed by multer to a temporary file, never held
 * in memory; the same errors as `singleUpload` (415, 413, 400). The handler removes the file.
 */
export function bagUpload(field: string, maxBytes: number) {
  const upload = multer({ storage: multer.diskStorage({ destination: os.tmpdir() }), limits: { fileSize: maxBytes, files: 1, fields: 5 } }).single(field);
  return (req: Request, res: Response, next: NextFunction) => {
    if (!req.is('multipart/form-data')) return next(new AppError('unsupported_media_type', 415, `Send the bag as multipart/form-data in the field "${field}".`));
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
        return next(new AppError('payload_too_large', 413, `The bag is larger than ${Math.round(maxBytes / 1024 / 1024 / 1024)} GB.`));
      }
      next(validationFailed([{ path: field, message: (err as Error).message, code: 'upload' }]));
    });
  };
}
