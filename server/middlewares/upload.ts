import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { HttpError } from '../errors';

/**
 * One file from a multipart form (field `file`), kept in memory up to maxBytes. Too large -> 413,
 * not multipart or no file -> 415/400, all in the API's error shape.
 */
export function singleFile(maxBytes: number) {
  // Browsers send the file's name as UTF-8 bytes (HTML, "multipart/form-data encoding algorithm");
  // busboy's default reads them as Latin-1, which turned "č" into "Ä" and a C1 control.
  const upload = multer({ storage: multer.memoryStorage(), defParamCharset: 'utf8', limits: { fileSize: maxBytes, files: 1, fields: 20 } }).single('file');
  return (req: Request, res: Response, next: NextFunction) => {
    if (!req.is('multipart/form-data')) {
      return next(new HttpError(415, 'unsupported_media_type', 'Send the file as multipart/form-data in a field named "file".'));
    }
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(new HttpError(413, 'too_large', `The file is too large: at most ${Math.round(maxBytes / 1024 / 1024 * 10) / 10} MB.`, { file: 'Too large.' }));
        }
        return next(new HttpError(400, 'validation', 'Send one file in a field named "file".', { file: err.message }));
      }
      // Anything else comes from reading the form itself (busboy: a malformed part header, a body
      // cut short, no boundary): the request is at fault, not the server.
      if (err) return next(new HttpError(400, 'malformed_upload', 'The upload arrived garbled. Choose the file and send it again.', { file: 'The upload arrived garbled.' }));
      if (!req.file) return next(new HttpError(400, 'validation', 'Choose a file to upload.', { file: 'Choose a file.' }));
      next();
    });
  };
}
