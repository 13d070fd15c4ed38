/** The one error shape every API route answers with: `{error:{code,message,fields?}}`. */
export interface ApiErrorBody {
  error: {
    code: string;
    message: string;
    /** Field path (dot-joined) → message, for form errors. */
    fields?: Record<string, string>;
  };
}

/** Turns zod issues into the `fields` map of ApiErrorBody (first message per path wins). */
export function fieldErrors(issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.map(String).join('.') || '_';
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}
