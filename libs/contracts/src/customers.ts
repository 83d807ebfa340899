import { z } from 'zod';
import { emailSchema, idSchema } from './common';

// Customers: the people who own the vehicles a shop works on or consign to it (issue 9). Minimal
// contact records; invoices and settlements extend them later.

const text = (max: number, label: string) => z.string().trim().max(max, `${label} has at most ${max} characters.`);
const optionalText = (max: number, label: string) =>
  text(max, label)
    .nullish()
    .transform((v) => (v ? v : null));

const customerFields = {
  name: text(120, 'The name').min(1, 'Enter the customer’s name.'),
  // Empty means none; anything else must be an address.
  email: z
    .string()
    .trim()
    .nullish()
    .transform((v) => (v ? v : null))
    .pipe(emailSchema.nullable()),
  phone: optionalText(40, 'The phone number').refine((v) => v === null || /^[0-9+()\-. ]+$/.test(v), 'Use digits, spaces and + ( ) - . only in the phone number.'),
  address: optionalText(500, 'The address'),
  notes: optionalText(2000, 'The notes'),
};

export const customerInputSchema = z.object(customerFields).strict();
export type CustomerInput = z.input<typeof customerInputSchema>;

/** Only the fields sent change. */
export const customerUpdateSchema = z.object(customerFields).partial().strict();
export type CustomerUpdate = z.input<typeof customerUpdateSchema>;

export const customerSchema = z.object({
  id: idSchema,
  name: z.string(),
  email: z.string().nullable(),
  phone: z.string().nullable(),
  address: z.string().nullable(),
  notes: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Customer = z.infer<typeof customerSchema>;

export const customerIdParamsSchema = z.object({ shopId: idSchema, customerId: idSchema }).strict();

export const customerListQuerySchema = z
  .object({
    q: z.string().trim().max(120).optional(),
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(100).default(25),
  })
  .strict();

export const customerListResponseSchema = z.object({
  items: z.array(customerSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type CustomerListResponse = z.infer<typeof customerListResponseSchema>;
