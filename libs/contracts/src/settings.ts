import { z } from 'zod';

export const distanceUnits = ['mi', 'km'] as const;
export const pressureUnits = ['psi', 'kPa', 'bar'] as const;
export const labelSheetFormats = ['a4-3x8', 'letter-3x10', 'roll-62x29'] as const;

/** At most `places` decimal places (checked on the decimal text, not on binary floating point). */
const decimals = (places: number) => (n: number) => {
  const [, fraction = ''] = String(n).split('.');
  return !String(n).includes('e') && fraction.length <= places;
};

const minorPerUnit = z.number().int('Use whole minor units (e.g. pence).').min(0, 'Use zero or more.').max(100_000_000, 'That amount is too large.');

/** The shop's settings: one currency, units, tax and reorder parameters. */
export const shopSettingsSchema = z.object({
  name: z.string().trim().min(2, 'Use at least 2 characters.').max(120, 'Use at most 120 characters.'),
  address: z.string().trim().max(500, 'Use at most 500 characters.'),
  /** ISO 4217 alphabetic code. */
  currency: z
    .string()
    .trim()
    .regex(/^[A-Za-z]{3}$/, 'Use a three-letter ISO 4217 currency code such as GBP.')
    .transform((s) => s.toUpperCase())
    .refine((code) => Intl.supportedValuesOf('currency').includes(code), 'This is not a currency code we know.'),
  distanceUnit: z.enum(distanceUnits),
  pressureUnit: z.enum(pressureUnits),
  /** Percent, 0–100, up to 3 decimals. */
  taxRatePercent: z.number().min(0, 'Use 0 to 100.').max(100, 'Use 0 to 100.').refine(decimals(3), 'Use at most 3 decimal places.'),
  /** Minor units per hour. */
  labourRateMinorPerHour: minorPerUnit,
  /** Target probability of not running out during a lead time. */
  serviceLevel: z.number().min(0.5, 'Use 0.5 to 0.999.').max(0.999, 'Use 0.5 to 0.999.').refine(decimals(3), 'Use at most 3 decimal places.'),
  /** Cost of placing one order, minor units. */
  orderingCostMinor: minorPerUnit,
  /** Cost of holding stock, percent of its value per year. */
  holdingCostRatePercent: z.number().min(0, 'Use 0 to 100.').max(100, 'Use 0 to 100.').refine(decimals(3), 'Use at most 3 decimal places.'),
  labelSheetFormat: z.enum(labelSheetFormats),
});
export type ShopSettings = z.infer<typeof shopSettingsSchema>;

/** The values a new shop starts with. */
export const defaultShopSettings: Omit<ShopSettings, 'name'> = {
  address: '',
  currency: 'GBP',
  distanceUnit: 'mi',
  pressureUnit: 'psi',
  taxRatePercent: 20,
  labourRateMinorPerHour: 6000,
  serviceLevel: 0.95,
  orderingCostMinor: 2500,
  holdingCostRatePercent: 25,
  labelSheetFormat: 'a4-3x8',
};

/** A change to some settings; at least one field. */
export const updateShopSettingsRequestSchema = shopSettingsSchema
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one setting.');
export type UpdateShopSettingsRequest = z.infer<typeof updateShopSettingsRequestSchema>;
