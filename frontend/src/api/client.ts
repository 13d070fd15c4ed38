import type { ApiErrorBody } from '@shared/schemas/errors';

/** An error answer of the API (or a network failure, status 0), with the server's message. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    /** Field path (dot-joined) → message, when the server rejected form input. */
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

/** True for an ApiError with the given status. */
export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

/** A message fit to show a person for any thrown value. */
export function errorMessage(error: unknown): string {
  if (error instanceof Error && error.message) return error.message;
  return 'Something went wrong. Try again.';
}

type UnauthorizedListener = () => void;
let onUnauthorized: UnauthorizedListener | null = null;

/**
 * Registers the one reaction to a lapsed session (a 401 from any call but `/auth/me` and
 * `/auth/login`); the query setup uses it to clear the signed-in user.
 */
export function setUnauthorizedListener(listener: UnauthorizedListener | null): void {
  onUnauthorized = listener;
}

const SESSION_PATHS = new Set(['/auth/me', '/auth/login']);

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
}

const FALLBACK_MESSAGES: Record<number, string> = {
  400: 'The request was not accepted.',
  401: 'Please sign in again.',
  403: 'You are not allowed to do that.',
  404: 'Not found.',
  409: 'Someone else changed this in the meantime. Reload and try again.',
  413: 'The upload is too large.',
  429: 'Too many attempts. Wait a moment and try again.',
};

function isErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return typeof error === 'object' && error !== null && typeof (error as { message?: unknown }).message === 'string';
}

/**
 * Calls the JSON API under `/api` with the session cookie; resolves to the parsed body
 * (`undefined` for 204) or throws an ApiError carrying the server's `{error:{code,message,fields}}`.
 */
export async function api<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body, signal } = options;
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method,
      credentials: 'same-origin',
      headers: {
        Accept: 'application/json',
        ...(body !== undefined ? { 'Content-Type': 'application/json' } : {}),
      },
      body: body !== undefined ? JSON.stringify(body) : undefined,
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }

  if (response.status === 204) return undefined as T;

  const text = await response.text();
  let parsed: unknown = undefined;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = undefined;
    }
  }

  if (!response.ok) {
    if (response.status === 401 && !SESSION_PATHS.has(path)) onUnauthorized?.();
    if (isErrorBody(parsed)) {
      const { code, message, fields } = parsed.error;
      throw new ApiError(response.status, code || 'error', message, fields ?? {});
    }
    const message = FALLBACK_MESSAGES[response.status] ?? `The server answered ${response.status}.`;
    throw new ApiError(response.status, `http_${response.status}`, message);
  }

  if (parsed === undefined) {
    throw new ApiError(response.status, 'bad_response', 'The server sent an answer that could not be read.');
  }
  return parsed as T;
}
