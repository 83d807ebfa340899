import { z } from 'zod';
import { partOrigins } from './constants/catalogue';

// Fields of a part that other contracts (stock, purchasing) share with the catalogue's: a module of
// their own, so that a screen using them does not evaluate every catalogue schema.

export const partOriginSchema = z.enum(partOrigins, { error: 'Use genuine, reproduction or pattern.' });

/** A part number as printed: letters, digits and the separators people print between them. */
export const printedNumberSchema = z
  .string()
  .trim()
  .min(1, 'Enter the part number.')
  .max(40, 'A part number has at most 40 characters.')
  .regex(/[A-Za-z0-9]/, 'A part number needs at least one letter or digit.')
  .regex(/^[A-Za-z0-9 .\-/_]+$/, 'Use letters, digits, spaces, dots, dashes, slashes or underscores only.');
