import multer from 'multer';
import type { NextFunction, Request, Response } from 'express';
import { AppError, validationFailed } from '../errors';

/**
 * One small file in memory from a multipart field (CSV imports and previews), with multer's errors
 * turned into the envelope: not multipart → 415, too large → 413, anything else → 400 on `file`.
 * Images stream to disk instead: see middleware/image-upload.ts.
 */
export function singleUpload(field: string, maxBytes: number) {
  const handler = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 5 } }).single(field);
  return (req: Request, res: Response, next: NextFunction) => {
    if (!req.is('multipart/form-data')) return next(new AppError('unsupported_media_type', 415, `Send the file as multipart/form-data in the field "${field}".`));
    handler(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
        return next(new AppError('payload_too_large', 413, `The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB.`));
      }
      next(validationFailed([{ path: field, message: (err as Error).message, code: 'upload' }]));
    });
  };
}

/** The file `singleUpload` kept on the request, as UTF-8 text (400 when missing; 415 when it is not UTF-8 text). */
export function uploadedText(req: Request, saveAsHint: string): { name: string; text: string } {
  const file = req.file;
  if (!file) throw validationFailed([{ path: 'file', message: 'Choose a CSV file', code: 'required' }]);
  const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
  if (text.includes('\u0000') || text.includes('\uFFFD')) {
    throw new AppError('unsupported_media_type', 415, `The file is not UTF-8 text. ${saveAsHint}`);
  }
  return { name: file.originalname.slice(0, 200), text };
}
