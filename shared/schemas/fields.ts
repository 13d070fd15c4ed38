import { z } from 'zod';

/**
 * Number fields shared by the schemas: lengths in mm, angles in degrees, ids. They carry no field
 * names: messages take the field's label and unit from labels.ts (`issueSentence`), so the checks
 * here are zod's own (`too_small`, `too_big` with their bounds). `notANumber` replaces the message
 * for a value that is not a number. zod's number already refuses NaN and ±Infinity, so every field
 * here is finite.
 */

/** Largest length any field accepts, mm (100 m). */
export const MAX_LENGTH_MM = 100_000;
/** Largest angle any field accepts, degrees (two turns either way). */
export const MAX_ANGLE_DEG = 720;

/** A finite number; anything else gets `notANumber` (or the label's "… must be a number"). */
export const finiteNumber = (notANumber?: string) => z.number(notANumber === undefined ? undefined : { error: notANumber });

/** A finite number greater than 0 (no upper bound). */
export const positiveNumber = (notANumber?: string) => finiteNumber(notANumber).gt(0);

/** A finite number of at least 0 (no upper bound). */
export const nonNegativeNumber = (notANumber?: string) => finiteNumber(notANumber).min(0);

/** A length or coordinate, mm, within ±MAX_LENGTH_MM. */
export const lengthMm = (notANumber?: string) => finiteNumber(notANumber).min(-MAX_LENGTH_MM).max(MAX_LENGTH_MM);

/** A length greater than 0, mm, within MAX_LENGTH_MM. */
export const positiveMm = (notANumber?: string) => finiteNumber(notANumber).gt(0).max(MAX_LENGTH_MM);

/** A length of at least 0, mm, within MAX_LENGTH_MM. */
export const nonNegativeMm = (notANumber?: string) => finiteNumber(notANumber).min(0).max(MAX_LENGTH_MM);

/** An angle, degrees, within ±MAX_ANGLE_DEG. */
export const degrees = (notANumber?: string) => finiteNumber(notANumber).min(-MAX_ANGLE_DEG).max(MAX_ANGLE_DEG);

/** A database id: a whole number from 1 (`message` for anything else below 1). */
export const positiveId = (message?: string) => z.number().int().positive(message);

/** What a one-line text field says when it holds a control character. */
export const SINGLE_LINE_MESSAGE = 'Use one line of text without control characters';
/** Text of any length with no Unicode control character (category Cc: C0 incl. TAB, LF, CR; DEL; C1). */
export const NO_CONTROL_CHARACTERS = /^[^\p{Cc}]*$/u;

/**
 * A one-line text (a name or label), trimmed: no control characters, since a line break in a name
 * would start a new record in a DXF export or a new line in a mail header. Chain `.min`/`.max`.
 */
export const singleLineText = (params?: { error: string }) => z.string(params).trim().regex(NO_CONTROL_CHARACTERS, SINGLE_LINE_MESSAGE);

/** A longer text (description, comment): line breaks and tabs allowed, other control characters not. */
export const multiLineText = () =>
  z
    .string()
    .trim()
    .refine((v) => !/[^\P{Cc}\t\n\r]/u.test(v), { message: 'Use text without control characters (line breaks and tabs are fine)' });
