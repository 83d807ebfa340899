import { z } from 'zod';
import { consignmentTermsInputSchema, consignmentVehicleParamsSchema, payoutInputSchema, settlementInputSchema, shopIdParamsSchema } from '@tappet/contracts';
import type { RouteDoc } from '../../openapi/openapi';

const tag = 'consignment';
const base = (path: string) => `/api/shops/{shopId}/consignment${path}`;
const read = { 403: 'Mechanics see no consignment figures', 404: 'Not a member of that shop, or no such vehicle in it' };
const write = { 403: 'Only the owner agrees terms, settles and records payouts', 404: 'Not a member of that shop, or no such vehicle in it' };
const money = z.number().int().meta({ description: 'Minor units (pence, cents)' });
const settlement = z.looseObject({ id: z.string(), reference: z.string(), soldOn: z.string(), salePriceMinor: money, commissionMinor: money, workMinor: money, payoutMinor: money, consignorOwesMinor: money, payout: z.looseObject({ paidOn: z.string(), method: z.string(), reference: z.string() }).nullable() });
export const consignmentVehicleResponseSchema = z
  .looseObject({ vehicleId: z.string(), vehicle: z.string(), currency: z.string(), terms: z.looseObject({ commissionKind: z.enum(['percent', 'fixed']), commissionPercent: z.number().nullable(), commissionFixedMinor: money.nullable() }).nullable(), work: z.array(z.looseObject({ jobId: z.string(), chargedMinor: money })), settlement: settlement.nullable() })
  .meta({ id: 'ConsignmentVehicle' });

/** The consignment routes for the OpenAPI document. */
export const consignmentRouteDocs: RouteDoc[] = [
  { method: 'get', path: base('/vehicles'), summary: 'Consigned vehicles with their terms and settlement state', tag, auth: true, params: shopIdParamsSchema, response: z.object({ vehicles: z.array(z.looseObject({ vehicleId: z.string(), hasTerms: z.boolean(), paid: z.boolean() })) }), errors: read },
  { method: 'get', path: base('/vehicles/{vehicleId}'), summary: 'A consigned vehicle: terms, approved work, settlement', tag, auth: true, params: consignmentVehicleParamsSchema, response: consignmentVehicleResponseSchema, errors: read },
  { method: 'put', path: base('/vehicles/{vehicleId}/terms'), summary: 'Record the commission agreed at intake (percentage or fixed)', tag, auth: true, params: consignmentVehicleParamsSchema, body: consignmentTermsInputSchema, response: consignmentVehicleResponseSchema, errors: { ...write, 409: 'Not a consigned vehicle, or already settled' } },
  { method: 'post', path: base('/vehicles/{vehicleId}/settlement'), summary: 'Settle the sale: commission, approved work, payout (frozen)', tag, auth: true, params: consignmentVehicleParamsSchema, body: settlementInputSchema, response: consignmentVehicleResponseSchema, status: 201, errors: { ...write, 409: 'No terms yet, or already settled' } },
  { method: 'post', path: base('/vehicles/{vehicleId}/settlement/payout'), summary: 'Record the payout to the consignor (once)', tag, auth: true, params: consignmentVehicleParamsSchema, body: payoutInputSchema, response: consignmentVehicleResponseSchema, errors: { ...write, 409: 'Not settled, already paid, or nothing due' } },
  { method: 'get', path: base('/vehicles/{vehicleId}/settlement/pdf'), summary: 'The settlement as PDF', tag, auth: true, params: consignmentVehicleParamsSchema, responseType: 'application/pdf', response: z.string(), errors: { ...read, 409: 'Not settled yet' } },
];
