import { toNestErrors, validateFieldsNatively } from '@hookform/resolvers';
import type { FieldError, FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';
import { issueSentence } from '@shared/schemas/labels';

/**
 * A react-hook-form resolver checking with the same zod schema the server uses, whose messages are
 * the sentences of shared/schemas/labels.ts ("Stop time (category 0) must be greater than 0 s"),
 * so a form says what the server would say, by the field's label.
 */
export function labelledResolver<Input extends FieldValues, Output>(schema: z.ZodType<Output, Input>): Resolver<Input, unknown, Output> {
  return async (values, _context, options) => {
    const r = await schema.safeParseAsync(values);
    if (r.success) {
      if (options.shouldUseNativeValidation) validateFieldsNatively({}, options);
      return { values: r.data, errors: {} };
    }
    const flat: Record<string, FieldError> = {};
    for (const issue of r.error.issues) {
      const key = issue.path.map(String).join('.');
      flat[key] ??= { type: issue.code, message: issueSentence(issue, { input: values }) };
    }
    return { values: {}, errors: toNestErrors(flat, options) };
  };
}
