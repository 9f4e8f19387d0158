import type { ErrorRequestHandler, RequestHandler } from 'express';
import { z } from 'zod';

export interface ErrorDetail {
  path: string;
  message: string;
}

/** An error the caller can act on: answered as `{ error: { code, message, details? } }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} was not found.`);

/** zod issues as `{ path, message }`, the path written the way the documents' JSON paths are. */
export function zodDetails(error: z.ZodError): ErrorDetail[] {
  return error.issues.map((issue) => ({
    path: issue.path.length ? '$' + issue.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('') : '$',
    message: issue.message,
  }));
}

function parseWith<S extends z.ZodType>(schema: S, data: unknown, where: string): z.output<S> {
  const result = schema.safeParse(data);
  if (!result.success) {
    const details = zodDetails(result.error);
    const first = details[0];
    throw new HttpError(400, 'invalid_request', `The ${where} is not valid: ${first ? `${first.path} ${first.message}` : 'see details'}.`, details);
  }
  return result.data;
}

export const parseBody = <S extends z.ZodType>(schema: S, body: unknown) => parseWith(schema, body ?? {}, 'request body');
export const parseQuery = <S extends z.ZodType>(schema: S, query: unknown) => parseWith(schema, query ?? {}, 'query');
export const parseParams = <S extends z.ZodType>(schema: S, params: unknown) => parseWith(schema, params ?? {}, 'address');

/** Unknown /api routes answer JSON, not the client's HTML. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No route ${req.method} ${req.originalUrl}.`));
};

/** The one error handler: known errors keep their status, the rest are 500 without a stack. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details !== undefined ? { details: err.details } : {}) } });
    return;
  }
  // body-parser and multer errors carry a status or a code of their own.
  const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : undefined;
  if (err?.type === 'entity.too.large' || err?.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json({ error: { code: 'too_large', message: 'The upload is larger than allowed.' } });
    return;
  }
  if (err?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'invalid_json', message: 'The request body is not valid JSON.' } });
    return;
  }
  if (typeof err?.code === 'string' && err.code.startsWith('LIMIT_')) {
    res.status(400).json({ error: { code: 'invalid_upload', message: String(err.message ?? 'The upload was refused.') } });
    return;
  }
  if (status && status >= 400 && status < 500) {
    res.status(status).json({ error: { code: 'bad_request', message: String(err.message ?? 'The request was refused.') } });
    return;
  }
  console.error(`[error] ${req.method} ${req.originalUrl}:`, err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server. The error was logged.' } });
};
