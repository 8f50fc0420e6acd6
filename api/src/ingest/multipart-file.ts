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

export type FileHandler<T> = (fields: Record<string, unknown>, file: Readable) => Promise<T>;

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
  const storage: multer.StorageEngine = {
    _handleFile(request, file, callback) {
      onFile({ ...(request.body as Record<string, unknown>) }, file.stream).then(
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
  const upload = multer({ storage, limits: { files: 1, fileSize: maxFileBytes, fields: 60, fieldSize: 64 * 1024, parts: 70 } }).single('file');
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
