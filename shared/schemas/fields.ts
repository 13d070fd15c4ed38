import { z } from 'zod';

/**
 * Number fields shared by the schemas: lengths in mm, angles in degrees, ids. Each takes the name
 * the messages use; `notANumber` replaces the message for a value that is not a number.
 * zod's number already refuses NaN and ±Infinity, so every field here is finite.
 */

/** Largest length any field accepts, mm (100 m). */
export const MAX_LENGTH_MM = 100_000;
/** Largest angle any field accepts, degrees (two turns either way). */
export const MAX_ANGLE_DEG = 720;

/** A finite number; anything else gets `notANumber`. */
export const finiteNumber = (what: string, notANumber = `${what} must be a number`) => z.number({ error: notANumber });

/** A finite number greater than 0 (no upper bound). */
export const positiveNumber = (what: string, notANumber?: string) =>
  finiteNumber(what, notANumber).refine((v) => v > 0, { message: `${what} must be greater than 0` });

/** A finite number of at least 0 (no upper bound). */
export const nonNegativeNumber = (what: string, notANumber?: string) =>
  finiteNumber(what, notANumber).refine((v) => v >= 0, { message: `${what} must not be negative` });

/** A length or coordinate, mm, within ±MAX_LENGTH_MM. */
export const lengthMm = (what: string, notANumber?: string) =>
  finiteNumber(what, notANumber).refine((v) => Math.abs(v) <= MAX_LENGTH_MM, { message: `${what} must be within ±${MAX_LENGTH_MM} mm` });

/** A length greater than 0, mm, within MAX_LENGTH_MM. */
export const positiveMm = (what: string, notANumber?: string) => lengthMm(what, notANumber).refine((v) => v > 0, { message: `${what} must be greater than 0` });

/** A length of at least 0, mm, within MAX_LENGTH_MM. */
export const nonNegativeMm = (what: string, notANumber?: string) => lengthMm(what, notANumber).refine((v) => v >= 0, { message: `${what} must not be negative` });

/** An angle, degrees, within ±MAX_ANGLE_DEG. */
export const degrees = (what: string, notANumber?: string) =>
  finiteNumber(what, notANumber).refine((v) => Math.abs(v) <= MAX_ANGLE_DEG, { message: `${what} must be within ±${MAX_ANGLE_DEG}°` });

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
