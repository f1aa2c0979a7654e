import type { RequestHandler } from 'express';
import multer, { MulterError } from 'multer';
import { IMAGE_MAX_BYTES } from '../../shared/schemas/evidence';
import { invalid, payloadTooLarge } from '../errors';

const MB = 1024 * 1024;

const parseUpload = multer({
  // Held in memory, never in a temporary file: an upload that is cut short leaves nothing
  // behind, and the bytes are hashed and checked before anything is stored.
  storage: multer.memoryStorage(),
  limits: { fileSize: IMAGE_MAX_BYTES, files: 1, fields: 8, parts: 10, fieldSize: 32 * 1024 },
  // Browsers send UTF-8 file names (µm, Å…) without declaring a charset.
  defParamCharset: 'utf8',
}).single('file');

function describeMulterError(error: MulterError) {
  switch (error.code) {
    case 'LIMIT_FILE_SIZE':
      return payloadTooLarge(`Files up to ${IMAGE_MAX_BYTES / MB} MB are accepted. Save a smaller copy and try again.`);
    case 'LIMIT_UNEXPECTED_FILE':
    case 'LIMIT_FILE_COUNT':
      return invalid({ file: ['Send exactly one file, in the form part named "file".'] });
    default:
      return invalid({ _: [`The upload form is not what Flakeline expects (${error.message.toLowerCase()}).`] });
  }
}

/**
 * Reads a multipart/form-data upload with one file part named `file` into `req.file` and its
 * text fields into `req.body`, with size limits. Runs after access and CSRF checks, so nobody
 * can make the server read an upload they may not make.
 */
export const evidenceUpload: RequestHandler[] = [
  (req, _res, next) => {
    if (!req.is('multipart/form-data')) {
      next(invalid({ file: ['Send the file as multipart/form-data, in a part named "file".'] }));
      return;
    }
    next();
  },
  (req, res, next) => {
    parseUpload(req, res, (error?: unknown) => {
      if (!error) {
        if (!req.file) return next(invalid({ file: ['Choose a file to upload.'] }));
        return next();
      }
      if (error instanceof MulterError) return next(describeMulterError(error));
      // Busboy's complaints about a malformed or truncated body (e.g. "Unexpected end of form").
      return next(invalid({ file: ['The upload arrived incomplete or malformed. Try again.'] }));
    });
  },
];
