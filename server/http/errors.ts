import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ApiErrorBody } from '../../shared/schemas/common';

/** An error with an HTTP status and a stable code the client can act on. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, field?: string) => new HttpError(400, 'invalid_input', message, field);
export const unauthorized = () => new HttpError(401, 'authentication_required', 'Sign in first.');
export const forbidden = (message = 'Your role may not do this.') => new HttpError(403, 'forbidden', message);
export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} not found.`);
export const conflict = (message: string, field?: string) => new HttpError(409, 'conflict', message, field);

/** First zod issue as a message naming the field by its dotted path. */
export function fromZod(err: ZodError, where: 'body' | 'query' | 'params' = 'body'): HttpError {
  const issue = err.issues[0];
  const field = issue?.path.map(String).join('.') || undefined;
  const message = field ? `${field}: ${issue.message}` : `${where}: ${issue?.message ?? 'invalid'}`;
  return badRequest(message, field);
}

/** Maps any thrown error to `{error: {code, message, field?}}`; unexpected ones are logged, not leaked. */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  let e: HttpError;
  if (err instanceof HttpError) e = err;
  else if (err instanceof ZodError) e = fromZod(err);
  else if (err?.code === 'EBADCSRFTOKEN' || err?.message === 'invalid csrf token') e = new HttpError(403, 'csrf_invalid', 'The form expired or came from elsewhere; reload and try again.');
  else if (err?.type === 'entity.parse.failed') e = badRequest('body: not valid JSON');
  else if (err instanceof URIError) e = badRequest('path: malformed URL encoding');
  else if (err?.type === 'entity.too.large') e = new HttpError(413, 'too_large', 'The request body is too large.');
  else if (err?.name === 'MulterError') e = new HttpError(err.code === 'LIMIT_FILE_SIZE' ? 413 : 400, 'invalid_upload', `${err.field ?? 'file'}: ${err.message}`, err.field);
  else if (err?.name === 'SequelizeUniqueConstraintError') {
    const field = err.errors?.[0]?.path;
    e = conflict(`${field ?? 'value'}: already in use`, field);
  } else if (err?.name === 'SequelizeForeignKeyConstraintError') e = conflict('Still referenced by other records, or refers to a record that does not exist.');
  else if (err?.name?.startsWith?.('SequelizeConnection') || err?.code === 'ECONNREFUSED') e = new HttpError(503, 'database_unavailable', 'The database is not reachable; try again shortly.');
  else {
    console.error(err);
    e = new HttpError(500, 'internal', 'Something went wrong on the server.');
  }
  const body: ApiErrorBody = { error: { code: e.code, message: e.message, ...(e.field ? { field: e.field } : {}) } };
  res.status(e.status).json(body);
};
