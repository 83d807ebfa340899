import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError, badRequest } from '../../lib/http-error';

export interface UploadLimits {
  /** Largest single file, in bytes. */
  maxFileBytes: number;
  /** Most files in one request. */
  maxFiles: number;
}

/** Limits for vehicle photos and documents. */
export const vehicleUploadLimits: UploadLimits = { maxFileBytes: 15 * 1024 * 1024, maxFiles: 10 };

const mb = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;

/**
 * Reads a multipart form into memory (multer memory storage: nothing touches the disk until the
 * content has been checked), with size and count limits, files in `field`. multer's errors become
 * the API's error shape with a message for people.
 */
export function memoryUpload(field: string, limits: UploadLimits): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    // utf8: browsers send file names as UTF-8 without saying so.
    defParamCharset: 'utf8',
    limits: { fileSize: limits.maxFileBytes, files: limits.maxFiles, fields: 5, fieldSize: 1024, parts: limits.maxFiles + 5 },
  }).array(field, limits.maxFiles);
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        switch (err.code) {
          case 'LIMIT_FILE_SIZE':
            return next(new HttpError(413, 'payload_too_large', `${err.field ? 'A file' : 'The file'} is larger than ${mb(limits.maxFileBytes)}. Upload smaller files (scan documents at 200–300 dpi).`));
          case 'LIMIT_FILE_COUNT':
          case 'LIMIT_UNEXPECTED_FILE':
            return next(badRequest(err.code === 'LIMIT_FILE_COUNT' || err.field === field ? `Upload at most ${limits.maxFiles} files at a time.` : `Send the files in the form field "${field}".`));
          default:
            return next(badRequest(`The upload could not be read (${err.message}).`));
        }
      }
      next(err);
    });
  };
}

/**
 * Reads one CSV file, in form field "file", into memory beside at most `fields` small form
 * fields (kind, mode). Too large is 413; any other problem with the form is 400, with a message
 * for people. Used by the catalogue and supplier-listing imports.
 */
export function csvUpload(limits: { maxFileBytes: number; fields: number }): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: limits.maxFileBytes, files: 1, fields: limits.fields, fieldSize: 1024 } }).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'payload_too_large', `The file is larger than ${mb(limits.maxFileBytes)}. Split it into smaller files.`));
        if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') return next(badRequest('Send one CSV file in the form field "file".'));
        return next(badRequest(`The upload could not be read (${err.message}).`));
      }
      next(err);
    });
  };
}
