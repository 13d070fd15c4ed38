import type { z } from 'zod';
import { fieldErrors } from '@shared/schemas/errors';
import { badRequest, notFound } from './errors';

/** Parses a request part with a zod schema; throws a 400 with per-field messages. */
export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, what = 'The request'): z.infer<S> {
  const r = schema.safeParse(value ?? {});
  if (!r.success) {
    const fields = fieldErrors(r.error.issues);
    const first = r.error.issues[0];
    const where = first && first.path.length ? ` (${first.path.join('.')})` : '';
    throw badRequest(`${what} has invalid fields${where}: ${first?.message ?? 'invalid'}.`, fields);
  }
  return r.data;
}

/** A positive integer route id, or 404 (a malformed id names nothing). */
export function idParam(raw: unknown, what = 'That item'): number {
  const s = String(raw ?? '');
  if (!/^[1-9]\d{0,9}$/.test(s)) throw notFound(what);
  const n = Number(s);
  if (n > 2147483647) throw notFound(what);
  return n;
}
