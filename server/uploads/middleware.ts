import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { UPLOAD_MAX_BYTES, UPLOAD_MAX_IN_WORDS } from '../../src/contract/uploads';
import { badRequest, HttpError } from '../http/errors';

/**
 * Reads one multipart file into memory (at most 10 MB, one file, a few short text fields). Nothing reaches
 * the disk here, so a refused or broken upload leaves nothing behind. A request that is not multipart
 * passes through without a file, and the route then says a file is needed.
 */
export function singleFileUpload(field = 'file') {
  const parse = multer({
    storage: multer.memoryStorage(),
    defParamCharset: 'utf8',
    limits: { fileSize: UPLOAD_MAX_BYTES, files: 1, fields: 8, fieldSize: 4096, fieldNameSize: 100, parts: 10, headerPairs: 50 },
  }).single(field);
  const middleware = (req: Request, res: Response, next: NextFunction) => {
    parse(req, res, (error?: unknown) => next(error === undefined ? undefined : uploadError(error, field)));
  };
  // Marks the route as taking a file, so the security suite finds every upload route in the route table.
  return Object.assign(middleware, { uploadField: field });
}

function uploadError(error: unknown, field: string): HttpError {
  if (error instanceof HttpError) return error;
  if (error instanceof multer.MulterError) {
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return new HttpError(413, 'file_too_large', `The file is larger than ${UPLOAD_MAX_IN_WORDS}. Make it smaller (for a photo, a lower resolution) and upload it again.`, [
          { path: field, message: `At most ${UPLOAD_MAX_IN_WORDS}.` },
        ]);
      case 'LIMIT_FILE_COUNT':
      case 'LIMIT_UNEXPECTED_FILE':
        return badRequest(`Send one file, in the form field '${field}'.`, 'unexpected_file', [{ path: error.field ?? field, message: 'Not expected here.' }]);
      case 'LIMIT_FIELD_VALUE':
        return badRequest('A form field is too long.', 'field_too_long', error.field ? [{ path: error.field, message: 'Too long.' }] : undefined);
      default:
        return badRequest('The upload has too many or malformed form fields.', 'bad_upload_form');
    }
  }
  // busboy: a broken or cut-off multipart body.
  return badRequest('The upload could not be read, perhaps because it was interrupted. Try again.', 'bad_upload');
}
