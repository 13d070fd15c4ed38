import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '@shared/schemas/errors';
import { isDatabaseUnavailable } from '../db/availability';

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

/** The status an error of a library carries (body-parser, serve-static, …), when it is a 4xx. */
function clientStatus(err: unknown): number | null {
  if (!err || typeof err !== 'object') return null;
  const e = err as { status?: unknown; statusCode?: unknown };
  const status = typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : null;
  return status != null && status >= 400 && status < 500 ? status : null;
}

const CLIENT_ERRORS: Record<number, { code: string; message: string }> = {
  400: { code: 'bad_request', message: 'The request could not be read.' },
  403: { code: 'forbidden', message: 'That path is not allowed.' },
  404: { code: 'not_found', message: 'Not found.' },
  405: { code: 'method_not_allowed', message: 'That method is not allowed here.' },
  413: { code: 'too_large', message: 'The request body is too large.' },
  415: { code: 'unsupported_media', message: 'The request body has a content type or character set the server does not read (send UTF-8 JSON).' },
};

export const UNAVAILABLE_MESSAGE = 'The database is not reachable at the moment. Try again in a little while; nothing was changed.';

/** Renders every error as `{error:{code,message,fields?}}`; never a stack trace; logs server errors (5xx) only. */
export function errorMiddleware(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let status = 500;
    let body: ApiErrorBody = { error: { code: 'internal', message: 'Something went wrong on the server. The error was logged.' } };
    const libStatus = clientStatus(err);
    if (err instanceof HttpError) {
      status = err.status;
      body = { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) }, ...(err.extra ?? {}) } as ApiErrorBody;
    } else if (err && typeof err === 'object' && 'type' in err && (err as { type: string }).type === 'entity.parse.failed') {
      status = 400;
      body = { error: { code: 'bad_json', message: 'The request body is not valid JSON.' } };
    } else if (isDatabaseUnavailable(err)) {
      // Said once by the pool listeners, not per request: an outage would flood the log.
      status = 503;
      body = { error: { code: 'unavailable', message: UNAVAILABLE_MESSAGE } };
      res.set('Retry-After', '5');
    } else if (libStatus) {
      status = libStatus;
      body = { error: CLIENT_ERRORS[libStatus] ?? { code: 'bad_request', message: 'The request could not be handled.' } };
    } else {
      log(`${req.method} ${req.originalUrl}`, err);
    }
    if (res.headersSent) return;
    res.status(status).json(body);
  };
}

/** Errors outside /api (static files): plain text; 4xx passed through unlogged, 5xx logged. */
export function plainErrorMiddleware(log: (msg: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const status = clientStatus(err) ?? (isDatabaseUnavailable(err) ? 503 : 500);
    if (status >= 500 && status !== 503) log(`${req.method} ${req.originalUrl}`, err);
    if (res.headersSent) return;
    res.status(status).type('text/plain').send(status === 404 ? 'Not found.' : status < 500 ? 'Bad request.' : 'Something went wrong on the server.');
  };
}
