import multer from 'multer';
import type { NextFunction, Request, Response } from 'express';
import { AppError, validationFailed } from '../errors';

/**
 * One small file in memory from a multipart field (CSV imports and previews), with multer's errors
 * turned into the envelope: not multipart → 415, too large → 413, anything else → 400 on `file`.
 * Images stream to disk instead: see middleware/image-upload.ts.
 */
export function singleUpload(field: string, maxBytes: number) {
  return fileUploads([field], maxBytes, false);
}

/**
 * Small files in memory, at most one per named multipart field (an import's prints and steps files),
 * with the same errors as `singleUpload`. A file in a field not named is refused.
 */
export function fileUploads(fields: string[], maxBytes: number, several = true) {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: fields.length, fields: 5 } });
  const handler = several ? upload.fields(fields.map((name) => ({ name, maxCount: 1 }))) : upload.single(fields[0]);
  return (req: Request, res: Response, next: NextFunction) => {
    if (!req.is('multipart/form-data')) return next(new AppError('unsupported_media_type', 415, `Send the file as multipart/form-data in the field "${fields[0]}".`));
    handler(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError && err.code === 'LIMIT_FILE_SIZE') {
        return next(new AppError('payload_too_large', 413, `The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MB.`));
      }
      const path = err instanceof multer.MulterError && err.field ? err.field : fields[0];
      next(validationFailed([{ path, message: (err as Error).message, code: 'upload' }]));
    });
  };
}

/** The file `singleUpload` kept on the request, as UTF-8 text (400 when missing; 415 when it is not UTF-8 text). */
export function uploadedText(req: Request, saveAsHint: string): { name: string; text: string } {
  const text = uploadedTextOf(req, 'file', saveAsHint);
  if (!text) throw validationFailed([{ path: 'file', message: 'Choose a CSV file', code: 'required' }]);
  return text;
}

/** The file of one field kept by `singleUpload` or `fileUploads`, as UTF-8 text; null when none was sent (415 when it is not UTF-8 text). */
export function uploadedTextOf(req: Request, field: string, saveAsHint: string): { name: string; text: string } | null {
  const files = req.files as Record<string, Express.Multer.File[]> | undefined;
  const file = req.file?.fieldname === field ? req.file : files?.[field]?.[0];
  if (!file) return null;
  // UTF-8 decoding never yields an unpaired surrogate (bytes that would encode one, ED A0–BF xx, are
  // invalid UTF-8 and decode to U+FFFD), so refusing NUL and U+FFFD here applies the same input
  // rule as http/input-text.ts to the whole file.
  const text = new TextDecoder('utf-8', { fatal: false }).decode(file.buffer);
  if (text.includes('\u0000') || text.includes('\uFFFD')) {
    throw new AppError('unsupported_media_type', 415, `The file is not UTF-8 text. ${saveAsHint}`);
  }
  return { name: file.originalname.slice(0, 200), text };
}
