import { issueSentence, type IssueLike } from './labels';

/** The one error shape every API route answers with: `{error:{code,message,fields?}}`. */
export interface ApiErrorBody {
  error: {
    code: string;
    message: string;
    /** Field path (dot-joined) → a sentence naming the field by its label, for form errors. */
    fields?: Record<string, string>;
  };
}

/**
 * Turns zod issues into the `fields` map of ApiErrorBody: the field path as the key, the issue's
 * sentence (labels.ts) as the value; the first issue per path wins. `input` is the value parsed,
 * so list items are named by their ids; `prefix` is put before every key (`model.` …).
 */
export function fieldErrors(issues: ReadonlyArray<IssueLike>, opts: { input?: unknown; prefix?: string } = {}): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) {
    const path = issue.path.map(String).join('.');
    const key = opts.prefix ? (path ? `${opts.prefix}.${path}` : opts.prefix) : path || '_';
    if (!(key in out)) out[key] = issueSentence(issue, { input: opts.input });
  }
  return out;
}

/** "The arm model has invalid fields: Stop time (category 0) must be greater than 0 s (and 2 more)." */
export function invalidFieldsMessage(what: string, issues: ReadonlyArray<IssueLike>, input?: unknown): string {
  const first = issues[0];
  if (!first) return `${what} is not valid.`;
  const sentence = issueSentence(first, { input });
  const others = new Set(issues.slice(1).map((i) => i.path.map(String).join('.')));
  others.delete(first.path.map(String).join('.'));
  const more = others.size ? ` (and ${others.size} more)` : '';
  return `${what} has invalid fields: ${sentence}${more}${/[.!?]$/.test(sentence + more) ? '' : '.'}`;
}

/**
 * An error whose message is a sentence for the planner (what is wrong with their input, by labels
 * and names, never a property or a path). Everything else thrown is internal: `readableMessage`
 * does not show it.
 */
export class ReadableError extends Error {
  override name = 'ReadableError';
}

/** The message of a ReadableError; for anything else `fallback` (internal text never reaches people). */
export function readableMessage<F extends string | null>(err: unknown, fallback: F): string | F {
  return err instanceof ReadableError ? err.message : fallback;
}
