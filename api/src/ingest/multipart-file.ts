/**
 * A multipart/form-data upload with one file, read through multer with a storage engine that hands
 * the file's stream to the caller as it arrives (nothing is buffered or written to disk). The form
 * fields sent before the file are available when it starts.
 */
import type { Request, Response } from 'express';
import multer from 'multer';
import type { Readable } from 'node:stream';
import { Problem } from '../errors/problem.js';
import { tooLarge } from './body-stream.js';

/**
 * Handles the form's file. `formRead` settles once the whole form has been read: it rejects when the
 * form goes on to fail (a second file), so a handler that waits for it before committing anything
 * leaves nothing behind from a form answered with an error.
 */
export type FileHandler<T> = (fields: Record<string, unknown>, file: Readable, formRead: Promise<void>) => Promise<T>;

const MULTER_PROBLEMS: Record<string, string> = {
  LIMIT_PART_COUNT: 'too many parts in the form',
  LIMIT_FILE_COUNT: 'send exactly one file, in the field "file"',
  LIMIT_FIELD_KEY: 'a field name is too long',
  LIMIT_FIELD_VALUE: 'a field value is too long',
  LIMIT_FIELD_COUNT: 'too many fields in the form',
  LIMIT_UNEXPECTED_FILE: 'the file must be sent in the field "file"',
  MISSING_FIELD_NAME: 'a part of the form has no field name',
};

/** Reads the form in `req`, calling `onFile` for its file (field `file`); resolves with its result. */
export function readMultipartFile<T>(req: Request, res: Response, maxFileBytes: number, onFile: FileHandler<T>): Promise<T> {
  if (!req.is('multipart/form-data')) {
    return Promise.reject(new Problem('unsupported-media-type', 'Send the file as multipart/form-data (field "file", after the other fields)'));
  }
  let handled: { result: T } | null = null;
  let fileError: unknown = null;
  let files = 0;
  // Settles when the body has ended and busboy has parsed its last bytes, or rejects at a second file.
  let refuseForm: (err: Error) => void = () => undefined;
  const formRead = new Promise<void>((resolve, reject) => {
    refuseForm = reject;
    req.once('end', () => setImmediate(resolve));
    req.once('close', () => setImmediate(() => reject(new Problem('malformed-body', 'The upload ended before the form was complete'))));
  });
  formRead.catch(() => undefined); // settled for the handler; unhandled only when there is no file
  const storage: multer.StorageEngine = {
    _handleFile(request, file, callback) {
      onFile({ ...(request.body as Record<string, unknown>) }, file.stream, formRead).then(
        (result) => {
          handled = { result };
          callback(null, {});
        },
        (err: unknown) => {
          // The rest of the file is not wanted once it has failed.
          fileError = err;
          file.stream.resume();
          callback(err as Error);
        },
      );
    },
    _removeFile(_request, _file, callback) {
      callback(null);
    },
  };
  // A second file (or one in another field) is refused here rather than by multer's limits, so the
  // first file's handler hears of it before it commits.
  const fileFilter: multer.Options['fileFilter'] = (_request, file, callback) => {
    files += 1;
    if (files === 1 && file.fieldname === 'file') return callback(null, true);
    const err = new multer.MulterError(file.fieldname === 'file' ? 'LIMIT_FILE_COUNT' : 'LIMIT_UNEXPECTED_FILE', file.fieldname);
    refuseForm(err);
    callback(err);
  };
  const upload = multer({ storage, fileFilter, limits: { files: 2, fileSize: maxFileBytes, fields: 60, fieldSize: 64 * 1024, parts: 70 } }).any();
  return new Promise<T>((resolve, reject) => {
    upload(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') reject(tooLarge(maxFileBytes));
        else reject(new Problem('validation', MULTER_PROBLEMS[err.code] ?? err.message, { errors: [{ detail: MULTER_PROBLEMS[err.code] ?? err.message, pointer: `/${err.field ?? ''}` }] }));
      } else if (err && err === fileError) reject(err);
      else if (err) {
        // busboy's own errors: the body is not a well-formed multipart form.
        reject(new Problem('malformed-body', `The multipart form could not be read: ${(err as Error).message ?? String(err)}`));
      }
      else if (!handled) reject(new Problem('validation', 'The form has no file: send the CSV in the field "file"', { errors: [{ detail: 'required', pointer: '/file' }] }));
      else resolve(handled.result);
    });
  });
}
