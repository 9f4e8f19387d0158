/**
 * Capture uploads: a multer storage engine that writes the file to a temporary folder under
 * DATA_DIR and, in the same pass, feeds every chunk to a CaptureSummariser. Memory stays
 * bounded by the distinct identifiers, not by the file; the summary is ready when the file is.
 */
import { createWriteStream, mkdirSync } from 'node:fs';
import { rm } from 'node:fs/promises';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { StringDecoder } from 'node:string_decoder';
import type { Request, RequestHandler } from 'express';
import multer, { MulterError, type StorageEngine } from 'multer';
import { CaptureSummariser, type CaptureSummary } from '../../shared/can/candump';
import { HttpError } from '../errors';

/** Largest capture accepted (a 1,000,000-line log is about 45 MB). */
export const MAX_CAPTURE_BYTES = 512 * 1024 * 1024;

export interface SummarisedFile extends Express.Multer.File {
  summary: CaptureSummary;
}

class SummarisingStorage implements StorageEngine {
  constructor(private readonly dir: string) {}

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<SummarisedFile>) => void): void {
    mkdirSync(this.dir, { recursive: true });
    const target = path.join(this.dir, randomBytes(16).toString('hex'));
    const out = createWriteStream(target);
    const summariser = new CaptureSummariser();
    const decoder = new StringDecoder('utf8');
    let size = 0;
    let failed = false;
    const fail = (err: unknown) => {
      if (failed) return;
      failed = true;
      out.destroy();
      void rm(target, { force: true }).finally(() => cb(err));
    };
    file.stream.on('data', (chunk: Buffer) => {
      size += chunk.length;
      summariser.addChunk(decoder.write(chunk));
      if (!out.write(chunk)) {
        file.stream.pause();
        out.once('drain', () => file.stream.resume());
      }
    });
    file.stream.on('error', fail);
    out.on('error', fail);
    file.stream.on('end', () => {
      summariser.addChunk(decoder.end());
      out.end(() => {
        if (failed) return;
        cb(null, { path: target, size, summary: summariser.result() });
      });
    });
  }

  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void): void {
    rm(file.path, { force: true }).then(() => cb(null), (err: Error) => cb(err));
  }
}

/** `upload.single('file')` with our own words for multer's errors. */
export function captureUpload(dataDir: string): RequestHandler {
  const handler = multer({
    storage: new SummarisingStorage(path.join(dataDir, 'tmp', 'captures')),
    limits: { fileSize: MAX_CAPTURE_BYTES, files: 1, fields: 10 },
  }).single('file');
  return (req, res, next) => {
    handler(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'file_too_large', `The capture is larger than ${MAX_CAPTURE_BYTES / 1048576} MB. Split it with a shorter candump run.`));
        return next(new HttpError(400, 'invalid_upload', `The upload could not be read (${err.code}). Send one candump log as the field "file".`));
      }
      next(err);
    });
  };
}
