import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '@shared/schemas/errors';

/** An error with an HTTP status and a stable code; the error middleware renders it as JSON. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) =>
  new HttpError(400, 'invalid', message, fields);
export const unauthorized = (message = 'Sign in to continue.') => new HttpError(401, 'unauthorized', message);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'That item') => new HttpError(404, 'not_found', `${what} was not found.`);
export const conflict = (message: string, extra?: Record<string, unknown>) =>
  new HttpError(409, 'conflict', message, undefined, extra);

/** 404 for /api paths no router answered. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'no_route', `No API route ${req.method} ${req.originalUrl.split('?')[0]}.`));
};

/** Renders every error as `{error:{code,message,fields?}}`; never a stack trace. */
export function errorMiddleware(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let status = 500;
    let body: ApiErrorBody = { error: { code: 'internal', message: 'Something went wrong on the server. The error was logged.' } };
    if (err instanceof HttpError) {
      status = err.status;
      body = { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) }, ...(err.extra ?? {}) } as ApiErrorBody;
    } else if (err && typeof err === 'object' && 'type' in err && (err as { type: string }).type === 'entity.parse.failed') {
      status = 400;
      body = { error: { code: 'bad_json', message: 'The request body is not valid JSON.' } };
    } else if (err && typeof err === 'object' && 'type' in err && (err as { type: string }).type === 'entity.too.large') {
      status = 413;
      body = { error: { code: 'too_large', message: 'The request body is too large.' } };
    } else {
      log(`${req.method} ${req.originalUrl}`, err);
    }
    if (res.headersSent) return;
    res.status(status).json(body);
  };
}
