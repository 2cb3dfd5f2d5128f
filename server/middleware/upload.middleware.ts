import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Transform } from 'node:stream';
import type { Request, RequestHandler } from 'express';
import multer, { MulterError, type StorageEngine } from 'multer';
import { ZodError } from 'zod';
import { HttpError } from '../errors';
import type { StagedUpload } from '../services/clip.service';

/** Multer storage that streams each file to a temp folder and hashes it on the way (no buffering). */
function hashingDiskStorage(directory: string): StorageEngine {
  return {
    _handleFile(_req, file, callback) {
      // The pid in the name tells a later start whose file it was (a crashed process's is removed).
      const target = path.join(directory, `${process.pid}-${randomUUID()}.part`);
      const hash = createHash('sha256');
      let size = 0;
      const tap = new Transform({
        transform(chunk: Buffer, _encoding, done) {
          hash.update(chunk);
          size += chunk.length;
          done(null, chunk);
        },
      });
      fs.promises
        .mkdir(directory, { recursive: true })
        .then(() => pipeline(file.stream, tap, fs.createWriteStream(target)))
        .then(() =>
          callback(null, { path: target, size, sha256: hash.digest('hex') } as Partial<Express.Multer.File>),
        )
        .catch((error: Error) => {
          fs.rm(target, { force: true }, () => callback(error));
        });
    },
    _removeFile(_req, file, callback) {
      fs.rm(file.path, { force: true }, (error) => callback(error));
    },
  };
}

export function createUploadMiddleware(opts: {
  tempDir: string;
  maxBytes: number;
  /** Checks the text fields that arrived before the file; a rejection stops the upload before it streams. */
  precheck?: (req: Request) => Promise<void>;
}): RequestHandler {
  const handle = multer({
    storage: hashingDiskStorage(opts.tempDir),
    fileFilter: (req, _file, callback) => {
      if (!opts.precheck) return callback(null, true);
      opts.precheck(req).then(
        () => callback(null, true),
        (error: Error) => callback(error),
      );
    },
    defParamCharset: 'utf8',
    limits: { fileSize: opts.maxBytes, files: 1, fields: 20, fieldSize: 64 * 1024 },
  }).single('file');
  return (req, res, next) =>
    handle(req, res, (error?: unknown) => next(error === undefined ? undefined : asUploadError(error)));
}

/**
 * The multipart parser's own complaints (no boundary, a form cut off before its closing boundary, a
 * broken part header) are the client's mistake: 400 with a message, not a server error. Errors with a
 * code (disk full, file system) and the checks' own answers pass through unchanged.
 */
function asUploadError(error: unknown): unknown {
  if (error instanceof HttpError || error instanceof MulterError || error instanceof ZodError) return error;
  if (!(error instanceof Error) || (error as NodeJS.ErrnoException).code !== undefined) return error;
  return new HttpError(
    400,
    'malformed_upload',
    `The upload is not a complete multipart form (${error.message}); send the fields and one file with multipart/form-data`,
  );
}

export function stagedUpload(req: Request): StagedUpload | undefined {
  const file = req.file as (Express.Multer.File & { sha256?: string }) | undefined;
  if (!file) return undefined;
  return { path: file.path, size: file.size, sha256: file.sha256 ?? '', originalName: file.originalname };
}
