import type { z } from 'zod';
import { fieldErrors, invalidFieldsMessage } from '@shared/schemas/errors';
import { badRequest, notFound } from './errors';

/**
 * Parses a request part with a zod schema; throws a 400 whose message and `fields` name each field
 * by its label (shared/schemas/labels.ts), keyed by the field path.
 */
export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, what = 'The request'): z.infer<S> {
  const input = value ?? {};
  const r = schema.safeParse(input);
  if (!r.success) throw invalidInput(what, r.error.issues, input);
  return r.data;
}

/** The 400 of input that failed its schema: readable message and fields (paths under `prefix` when given). */
export function invalidInput(what: string, issues: z.core.$ZodIssue[], input: unknown, prefix?: string) {
  return badRequest(invalidFieldsMessage(what, issues, input), fieldErrors(issues, { input, prefix }));
}

/** A positive integer route id, or 404 (a malformed id names nothing). */
export function idParam(raw: unknown, what = 'That item'): number {
  const s = String(raw ?? '');
  if (!/^[1-9]\d{0,9}$/.test(s)) throw notFound(what);
  const n = Number(s);
  if (n > 2147483647) throw notFound(what);
  return n;
}
